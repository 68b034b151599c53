/**
 * Monte Carlo over the tolerances stored on a chain's stage values: each trial draws every
 * toleranced value (uniform over ±tol, or normal with ±tol as 3σ), analyses the chain and
 * keeps the study's figures. Trials are independent and individually seeded, so a run can be
 * split into chunks, checkpointed and resumed with identical results.
 */
import type { ChainDocument } from '../../schema/chain';
import type { MonteCarloSpec } from '../../schema/studies';
import { analyzeChain } from '../index';
import { buildChain } from '../core/build';
import { settleLoadLevel } from '../core/load-level';
import { runNodeAnalysis } from '../core/nodes';
import { analyzeResonators } from '../core/resonators';
import { frequencyGrid } from '../core/sweep';
import { defaultCatalogue } from '../default-catalogue';
import type { AnalysisResult, MeasuredNetwork } from '../types';
import {
  cloneForEdit,
  StudySetupError,
  tolerancedValues,
  type ToleranceEntry,
} from './chain-values';
import { metricList, readMetrics, type MetricInfo } from './metrics';
import { drawDeviation, mulberry32, trialSeed } from './random';
import { drawnChainBuilder, type DrawnChainBuilder, type DrawnValue } from './drawn-chain';
import { builtTrialMetrics, trialMetrics, trialTracker, type TrialTracker } from './trial';

/** One trial: its draws (in units of each value's tolerance) and its figures. */
export interface Trial {
  index: number;
  /** Deviation per toleranced value: relative change = deviation × tol/100. */
  draws: number[];
  /** Figures in the order of the plan's metrics; null when not found. */
  metrics: (number | null)[];
  /** Why the trial's chain could not be analysed (a drawn value out of range), if so. */
  error?: string;
}

/** Everything fixed before the first trial. */
export interface MonteCarloPlan {
  spec: MonteCarloSpec;
  node: number;
  tolerances: ToleranceEntry[];
  metrics: MetricInfo[];
  resonatorCount: number;
  nominal: (number | null)[];
  /** The nominal resonators a trial follows (see trial.ts). */
  tracker: TrialTracker;
  /** Builds a trial's chain from the nominal (drawn-chain.ts); null: buildChain builds it. */
  drawn: DrawnChainBuilder | null;
  /** Document position of each toleranced value's stage. */
  stageIndex: number[];
}

export interface StudyInputs {
  doc: ChainDocument;
  dataFiles?: Readonly<Record<string, MeasuredNetwork>>;
}

/** The document with the spec's sweep points, ready to analyse. */
function withPoints(doc: ChainDocument, points: number | undefined): ChainDocument {
  const d = cloneForEdit(doc);
  if (points !== undefined) d.settings.sweep.points = points;
  return d;
}

function analyse(inputs: StudyInputs, doc: ChainDocument): AnalysisResult {
  return analyzeChain(doc, { sweep: false, dataFiles: inputs.dataFiles });
}

/** Checks the spec against the chain and analyses the nominal chain once. */
export function planMonteCarlo(inputs: StudyInputs, spec: MonteCarloSpec): MonteCarloPlan {
  const doc = withPoints(inputs.doc, spec.points);
  const tolerances = tolerancedValues(doc);
  if (tolerances.length === 0) {
    throw new StudySetupError(
      'no stage value has a tolerance: give at least one value a ± % in the editor first',
    );
  }
  const lastNode = doc.stages.length - 2;
  const node = spec.node ?? lastNode;
  if (node > lastNode) {
    throw new StudySetupError(
      `node ${node} does not exist: the chain's nodes are 0 to ${lastNode}`,
    );
  }
  const nominalResult = analyse(inputs, doc);
  const resonatorCount = nominalResult.resonators.length;
  const tracker = nominalTracker(inputs, doc, node);
  return {
    spec,
    node,
    tolerances,
    metrics: metricList(nominalResult, node),
    resonatorCount,
    nominal: readMetrics(nominalResult, node, resonatorCount),
    tracker,
    drawn: drawnChainBuilder(doc, tracker.nominal, inputs.dataFiles),
    stageIndex: tolerances.map((t) => doc.stages.findIndex((s) => s.id === t.stageId)),
  };
}

/** The resonators of the nominal chain (as the full analysis finds them) for trials to follow. */
function nominalTracker(inputs: StudyInputs, doc: ChainDocument, node: number): TrialTracker {
  const nominal = buildChain(doc, defaultCatalogue(), { dataFiles: inputs.dataFiles });
  const built = settleLoadLevel(nominal);
  const sweepNa = runNodeAnalysis(built, frequencyGrid(built.settings.sweep));
  return trialTracker(nominal, analyzeResonators(built, sweepNa), node);
}

/** Runs trial `index` of a plan. */
export function runTrial(inputs: StudyInputs, plan: MonteCarloPlan, index: number): Trial {
  const u = mulberry32(trialSeed(plan.spec.seed, index));
  const draws: number[] = [];
  const values: DrawnValue[] = plan.tolerances.map((t, i) => {
    const z = drawDeviation(u, plan.spec.distribution);
    draws.push(z);
    return { stageIndex: plan.stageIndex[i], key: t.key, value: t.nominal * (1 + (z * t.tolerancePct) / 100) }; // prettier-ignore
  });
  try {
    const drawn = plan.drawn?.build(values);
    if (drawn) return { index, draws, metrics: builtTrialMetrics(drawn, plan.tracker) };
    const doc = withPoints(inputs.doc, plan.spec.points);
    for (const v of values) doc.stages[v.stageIndex].values[v.key] = v.value;
    return { index, draws, metrics: trialMetrics(doc, plan.tracker, inputs.dataFiles) };
  } catch (err) {
    const metrics = plan.metrics.map(() => null);
    return { index, draws, metrics, error: err instanceof Error ? err.message : String(err) };
  }
}

/** Runs trials [from, to), reporting each to `onTrial` (for progress and checkpoints). */
export function runTrials(
  inputs: StudyInputs,
  plan: MonteCarloPlan,
  from: number,
  to: number,
  onTrial?: (t: Trial) => void,
): Trial[] {
  const out: Trial[] = [];
  for (let i = from; i < to; i++) {
    const t = runTrial(inputs, plan, i);
    out.push(t);
    onTrial?.(t);
  }
  return out;
}
