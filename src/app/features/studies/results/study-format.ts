/**
 * How the study pages write figures: through the one formatter the editor uses (prefixes,
 * units, the user's significant figures), so a study's numbers read like the budget's.
 */
import type { UnitKind } from '../../../../../shared/engine/types';
import type { OptimiserGoal } from '../../../../../shared/schema/studies';
import {
  decibels,
  engineering,
  nominalDecibels,
  nominalEngineering,
  percent,
  plain,
} from '../../editor/results/format-quantity';

/** A fraction 0…1 as a percentage, to the user's significant figures. */
export function pct(v: number | null | undefined): string {
  return percent(v);
}

/** A figure with its unit: prefixed for SI kinds, "dB" for levels, plain for ratios. */
export function withUnit(v: number | null | undefined, unit: UnitKind | undefined): string {
  if (v === null || v === undefined) return '—';
  if (unit === 'db' || unit === 'dbm') return decibels(v, unit === 'db' ? 'dB' : 'dBm');
  if (unit === undefined || unit === 'ratio' || unit === 'none') return plain(v);
  return engineering(v, unit);
}

/** The unit of the figure an optimiser goal judges. */
export function goalUnit(goal: OptimiserGoal | undefined): UnitKind | undefined {
  if (!goal) return undefined;
  return goal.kind === 'resonance' || goal.kind === 'bandwidth' ? 'hertz' : 'db';
}

/**
 * An optimiser goal in words. Its frequencies and levels are the user's: written as stated,
 * rounded to the figures but not padded ("Gain 20 dB", not "Gain 20.00 dB").
 */
export function goalText(goal: OptimiserGoal): string {
  const hz = (v: number) => nominalEngineering(v, 'hertz');
  const db = (v: number) => nominalDecibels(v);
  switch (goal.kind) {
    case 'resonance':
      return `Resonance of ${goal.stageId} at ${hz(goal.targetHz)}`;
    case 'bandwidth':
      return `−3 dB width at node ${goal.node}: ${hz(goal.targetHz)}`;
    case 'return-loss':
      return `Return loss ≥ ${db(goal.minDb)}, ${hz(goal.startHz)} to ${hz(goal.stopHz)}`;
    case 'noise-figure':
      return `Noise figure ≤ ${db(goal.maxDb)}`;
    case 'gain':
      return `Gain ${db(goal.targetDb)}`;
    case 'image-rejection':
      return `Image rejection ≥ ${db(goal.minDb)}`;
    case 'ripple':
      return `Ripple ≤ ${db(goal.maxDb)} at node ${goal.node}, ${hz(goal.startHz)} to ${hz(goal.stopHz)}`; // prettier-ignore
  }
}
