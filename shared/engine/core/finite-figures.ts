/**
 * The last check of an analysis: every figure a chain of real parts always has must be a
 * number. Values inside every parameter's range can still combine into an overflow
 * or an underflow (a chain of extreme but allowed parts); the answer would then be a page of
 * nulls (JSON's spelling of NaN and ±∞). Instead the chain is refused like any other value
 * the engine cannot take, naming the first stage whose output figures are lost.
 *
 * The rule (ours): a figure is lost when it is NaN (an overflow met an underflow: ∞ − ∞,
 * 0·∞), or infinite where it cannot be (a node voltage, a step-up, the power available from
 * the source). An infinite impedance is an open circuit and −∞ dB is "nothing gets
 * through", both honest answers; a NaN is not. Checked at f0: each node's impedances,
 * voltage, step-up and levels, each stage's gains and noise figures, the chain's noise figure,
 * noise floor and sensitivity; over the sweep, no node may lose its step-up at more than half
 * the points, nor the input its impedance. A figure that may honestly be absent (a bandwidth
 * whose edge lies outside the sweep, an IIP3 nobody stated, a VSWR without a reference) is
 * not checked.
 */
import { ChainValidationError, type ChainIssue } from '../errors';
import type { AnalysisResult, NodeReport, StageReport } from '../types';
import type { BuiltChain, BuiltStage } from './build';
import { stageName } from './build';
import { sweepNanShares } from './sweep-report';

const NODE_FIGURES = [
  'vPeak',
  'stepUp',
  'stepUpDb',
  'deliveredDbm',
  'availableDbm',
  'transducerGainDb',
] as const satisfies readonly (keyof NodeReport)[];
const STAGE_FIGURES = [
  'voltageGainDb',
  'availableGainDb',
  'noiseFigureDb',
  'cumulativeNoiseFigureDb',
  'inputLevelDbm',
] as const satisfies readonly (keyof StageReport)[];
const LEVEL_FIGURES = ['noiseFigureDb', 'noiseFloorDbm', 'sensitivityDbm'] as const;

/** Figures that are magnitudes of something finite: +∞ is an overflow there, not an answer. */
const BOUNDED = new Set<string>(['vPeak', 'stepUp', 'availableDbm']);

const isNaN = Number.isNaN;
const lostFigure = (key: string, v: number) => isNaN(v) || (BOUNDED.has(key) && v === Infinity);

function issue(stage: BuiltStage, what: string): ChainIssue {
  return {
    stageId: stage.id,
    stageIndex: stage.index,
    path: ['stages', stage.index],
    message:
      `${stageName(stage.index, stage.label, stage.type)}: the analysis loses ${what} (not a number); ` +
      'its values (or those of the stages next to it) combine beyond what can be computed ' +
      'in double precision; bring extreme values back toward their typical ranges',
  };
}

/**
 * Refuses an analysis that has lost a figure every chain has.
 * @throws ChainValidationError naming the first stage whose figures are lost
 */
export function assertFiniteFigures(built: BuiltChain, result: AnalysisResult): void {
  // Impedances toward the load are lost from the far end back: blame the stage after the
  // last node that lost its input impedance (the load when it is the last node). Voltages
  // and levels are lost from the source on: blame the stage ending at the first such node.
  const startingAt = (k: number): BuiltStage => built.twoPorts[k] ?? built.load;
  const endingAt = (k: number): BuiltStage => (k === 0 ? built.source : built.twoPorts[k - 1]);
  const lostZ = result.nodes.filter((n) => isNaN(n.zIn.re) || isNaN(n.zIn.im));
  if (lostZ.length > 0) {
    const k = lostZ[lostZ.length - 1].index;
    throw new ChainValidationError([issue(startingAt(k), `the impedance at its input (node ${k}) at f0`)]); // prettier-ignore
  }
  for (const n of result.nodes) {
    const lost = NODE_FIGURES.filter((k) => lostFigure(k, n[k]));
    if (lost.length > 0)
      throw new ChainValidationError([issue(endingAt(n.index), `${lost.join(', ')} at its output (node ${n.index}) at f0`)]); // prettier-ignore
  }
  result.stages.forEach((s, k) => {
    const lost = STAGE_FIGURES.filter((f) => lostFigure(f, s[f]));
    if (lost.length > 0)
      throw new ChainValidationError([issue(built.twoPorts[k], `${lost.join(', ')} at f0`)]);
  });
  const levels = LEVEL_FIGURES.filter((f) => lostFigure(f, result.levels[f]));
  if (levels.length > 0)
    throw new ChainValidationError([issue(built.source, `${levels.join(', ')} for the chain`)]);
  const sweep = result.sweep;
  if (!sweep) return;
  // Read from what the traces are computed from, so the check computes none of them.
  const lostShare = sweepNanShares(sweep);
  if (lostShare.zIn > 0.5)
    throw new ChainValidationError([issue(startingAt(0), 'the impedance at its input over most of the sweep')]); // prettier-ignore
  sweep.nodes.forEach((n, k) => {
    if (lostShare.stepUp[k] > 0.5)
      throw new ChainValidationError([issue(endingAt(n.index), `step-up at its output (node ${n.index}) over most of the sweep`)]); // prettier-ignore
  });
}
