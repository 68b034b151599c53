/**
 * The analysis of a whole chain: validation and building, node analysis at f0 and over the
 * sweep, resonators, selectivity, noise, linearity, levels and flags.
 */
import type { AnalysisResult, StageDefinition } from './types';
import type { ChainDocument } from '../schema/chain';
import { buildChain, type BuildOptions, type BuiltChain } from './core/build';
import { assertFiniteFigures } from './core/finite-figures';
import { CAUTION_TEXT, raiseFlags } from './core/flags';
import { withMessageFigures } from './core/format';
import { settleLoadLevel } from './core/load-level';
import { isLongSweep, runNodeAnalysis, sharedWorkspace } from './core/nodes';
import { levelsReport, nodeReports, stageReports, sweepReport } from './core/reports';
import { analyzeResonators, resonatorNodes } from './core/resonators';
import type { ShapeMemo } from './core/response-shape';
import { analyzeSelectivity, findMixer, imageFrequency } from './core/selectivity';
import { frequencyGrid } from './core/sweep';
import { chainTopology, type Topology } from './core/topology';
import { defaultCatalogue } from './default-catalogue';
import { planChain, planFlags } from './planning';
import { gangTuningOf, type GangTuning } from './planning/spur-chart-gang';
import { analyseTransmit, isTrapResonance, judgeTraps, trapFlags } from './transmit';

/** Version of the engine's methods, stored with saved results. */
export const ENGINE_VERSION = '0.1.0';

export interface AnalyzeOptions extends BuildOptions {
  /** Include the sweep arrays in the result (default true). Selectivity is always computed. */
  sweep?: boolean;
  /**
   * Work out the receiver plan (spurs, strong signals, outside noise, converter) and its
   * flags; 'full' adds the spur chart across the tuning range and the IF choice.
   */
  plan?: boolean | 'full';
  /** Stage types to accept (default: the product's stage catalogue). */
  catalogue?: readonly StageDefinition[];
  /**
   * Significant figures of the flag sentences and validation issues (2..8; default 3), so
   * they match the figures the user reads elsewhere.
   */
  figures?: number;
  /** Filled in with how long the sweep's solve took (see `analyzeBuilt`). */
  clock?: SolveClock;
  /**
   * The sweep report reads the sweep's workspace in place instead of a copy of it, for a
   * caller that reads (or writes out) the report before it starts another analysis: the
   * next analysis in this thread reuses that workspace, and a read of the report after it
   * throws. (The copy, some 350 KB at 2,001 points, is most of what an analysis allocates
   * outside the JS heap, and such memory is what sets off V8's full collections here.)
   */
  sweepInPlace?: boolean;
}

/**
 * The sweep's solve alone (the node analysis: every node's voltage and impedance at every
 * point, what a circuit simulator's AC analysis computes), ms; set when the analysis ran,
 * for a caller that reports it beside the whole analysis (the CLI's --timing).
 */
export interface SolveClock {
  solveMs?: number;
}

/**
 * The nodes whose frequency and impedances the analysis reads from its sweep: the chain's
 * input (the sweep report's Zin and return loss) and the resonators' (`resonatorNodes`).
 */
export function sweepImpedanceNodes(
  built: BuiltChain,
  topo: Topology = chainTopology(built),
): number[] {
  const nodes = resonatorNodes(built, topo);
  return nodes[0] === 0 ? nodes : [0, ...nodes];
}

/**
 * Analyses an already built chain (for callers that build once and analyse many times).
 * @throws ChainValidationError when a figure every chain has is not finite (finite-figures.ts)
 */
export function analyzeBuilt(
  builtAsGiven: BuiltChain,
  options: {
    sweep?: boolean;
    plan?: boolean | 'full';
    tuning?: GangTuning | null;
    clock?: SolveClock;
    /** See {@link AnalyzeOptions.sweepInPlace}. */
    sweepInPlace?: boolean;
  } = {},
): AnalysisResult {
  const built = settleLoadLevel(builtAsGiven);
  const f0Hz = built.settings.f0Hz;
  const grid = frequencyGrid(built.settings.sweep);
  const f0Na = runNodeAnalysis(built, [f0Hz], sharedWorkspace('f0', built, 1));
  // The sweep's voltages are read at the user's nodes only (reports, selectivity, a coupled
  // pair's peak at its stage's end): the others are carried through, not stored, so a long
  // sweep writes and holds about half the voltages. A sweep too long to keep its workspace
  // keeps the frequencies and impedances only where they are read (the input, for the sweep
  // report, and where the resonators are searched): at 100,000 points on the bench chain a
  // quarter less peak memory.
  const topo = chainTopology(built);
  const sweepWs = sharedWorkspace('sweep', built, grid.length, {
    voltageAt: built.userNodeFlat,
    ...(isLongSweep(built, grid.length) ? { impedanceAt: sweepImpedanceNodes(built, topo) } : {}), // prettier-ignore
  });
  const solveStarted = options.clock ? performance.now() : 0;
  const sweepNa = runNodeAnalysis(built, grid, sweepWs);
  if (options.clock) options.clock.solveMs = performance.now() - solveStarted;
  const nodes = nodeReports(built, f0Na);
  const stages = stageReports(built, f0Na);
  // A branch to ground is judged as a trap; the resonances it alone makes are not tanks.
  // A coupled pair's peak found on the sweep is the selectivity's at that node too.
  const shapes: ShapeMemo = new Map();
  const findings = analyzeResonators(built, sweepNa, shapes, topo).filter((r) => !isTrapResonance(built, r)); // prettier-ignore
  const traps = judgeTraps(built, f0Na);
  const transmit = built.mode?.kind === 'transmit' ? analyseTransmit(built, f0Na) : undefined;
  const image = imageFrequency(built, findMixer(built));
  const selectivity = analyzeSelectivity(built, sweepNa, image, undefined, shapes);
  const flags = raiseFlags({ built, f0Na, resonators: findings });
  const levels = levelsReport(built, f0Na, stages);
  const plan = options.plan
    ? planChain(built, { nodes, stages, selectivity, levels, tuning: options.tuning }, options.plan === 'full') // prettier-ignore
    : undefined;
  if (plan) flags.push(...planFlags(plan, built.load.id, built.settings.planning !== undefined));
  flags.push(...trapFlags(traps), ...(transmit?.flags ?? []));
  const resonators = findings.map(
    ({ flat: _flat, fIn: _fIn, f0LocalHz: _f0, downstreamLabel: _down, name: _name, ...report }) =>
      report,
  );
  const result: AnalysisResult = {
    engineVersion: ENGINE_VERSION,
    f0Hz,
    nodes,
    stages,
    resonators,
    selectivity,
    levels,
    flags,
    ...(options.sweep === false
      ? {}
      : { sweep: sweepReport(built, sweepNa, grid, options.sweepInPlace === true) }),
    ...(plan ? { plan } : {}),
    ...(built.mode ? { mode: built.mode } : {}),
    ...(traps.length > 0 ? { traps } : {}),
    ...(transmit ? { transmit: transmit.report } : {}),
    ...(built.chainCautions
      ? { cautions: built.chainCautions.map((caution) => ({ caution, message: `This chain ${CAUTION_TEXT[caution]}` })) } // prettier-ignore
      : {}),
  };
  assertFiniteFigures(built, result);
  return result;
}

/**
 * Analyses a chain document.
 * @param doc the document as the chain schema parsed it (`parseChainDocument`)
 * @throws ChainValidationError listing every problem (stage, parameter, what to fix)
 */
export function analyzeChain(doc: ChainDocument, options: AnalyzeOptions = {}): AnalysisResult {
  return withMessageFigures(options.figures, () => analyzeAtFigures(doc, options));
}

function analyzeAtFigures(doc: ChainDocument, options: AnalyzeOptions): AnalysisResult {
  const catalogue = options.catalogue ?? defaultCatalogue();
  const built = buildChain(doc, catalogue, options);
  // The full plan charts spurs as the chain really tunes, by its marked gang (if any).
  const tuning =
    options.plan === 'full' && built.settings.variables?.length
      ? gangTuningOf(doc, (d) => buildChain(d, catalogue, options))
      : null;
  return analyzeBuilt(built, { ...options, tuning });
}
