import type { ChainDocument } from '../../../../../shared/schema/chain';
import type { OptimiserGoal, StudySpecInput } from '../../../../../shared/schema/studies';
import { parseQuantity } from '../../../../../shared/units';
import { fieldText } from '../../editor/results/format-quantity';
import { tunableStages, unitOfKey } from './tunable';

export type GoalKind = OptimiserGoal['kind'];

/** One value the optimiser varies, as typed (bounds are text with units). */
export interface VariableRow {
  stageId: string;
  key: string;
  min: string;
  max: string;
}

/** One goal as typed; which fields count depends on its kind. */
export interface GoalRow {
  kind: GoalKind;
  stageId: string;
  node: number;
  /** Target frequency (resonance, bandwidth) or band start (return loss, ripple). */
  hz: string;
  /** Band stop (return loss, ripple). */
  stopHz: string;
  /** Target, minimum or maximum in dB, by kind. */
  db: number;
  weight: number;
}

export const GOAL_KINDS: { kind: GoalKind; label: string }[] = [
  { kind: 'resonance', label: 'Resonance at a frequency' },
  { kind: 'bandwidth', label: '−3 dB width at a node' },
  { kind: 'return-loss', label: 'Return loss at the input over a band' },
  { kind: 'noise-figure', label: 'Noise figure at most' },
  { kind: 'gain', label: 'Gain' },
  { kind: 'image-rejection', label: 'Image rejection at least' },
  { kind: 'ripple', label: 'Ripple at a node over a band at most' },
];

/** Goals read at one node (bandwidth, ripple) and goals over a band (return loss, ripple). */
export const hasNode = (kind: GoalKind) => kind === 'bandwidth' || kind === 'ripple';
export const hasBand = (kind: GoalKind) => kind === 'return-loss' || kind === 'ripple';
/** Goals in dB (all but the two frequency goals). */
export const hasDb = (kind: GoalKind) => kind !== 'resonance' && kind !== 'bandwidth';

/** What the dB field of a goal means. */
export function dbLabel(kind: GoalKind): string {
  if (kind === 'gain') return 'Target';
  return kind === 'noise-figure' || kind === 'ripple' ? 'At most' : 'At least';
}

/**
 * A value to vary on `stageId` (its `key`, else its capacitance, else its first tunable
 * value), with bounds of half and twice the chain's value.
 */
export function variableRow(doc: ChainDocument, stageId: string, key?: string): VariableRow {
  const keys = tunableStages(doc).find((s) => s.id === stageId)?.keys ?? [];
  const k = key && keys.includes(key) ? key : keys.includes('c') ? 'c' : (keys[0] ?? 'c');
  const v = Number(doc.stages.find((s) => s.id === stageId)?.values[k] ?? 0);
  const unit = unitOfKey(k);
  return {
    stageId,
    key: k,
    min: v > 0 ? fieldText(v / 2, unit) : '',
    max: v > 0 ? fieldText(v * 2, unit) : '',
  };
}

const DEFAULT_DB: Record<GoalKind, number> = {
  resonance: 0,
  bandwidth: 0,
  'return-loss': 15,
  'noise-figure': 6,
  gain: 20,
  'image-rejection': 40,
  ripple: 1,
};

/** A goal of `kind` with starting figures from the chain (its f0, its last node). */
export function goalRow(kind: GoalKind, doc: ChainDocument, stageId: string): GoalRow {
  const f0 = doc.settings.f0Hz;
  const span = kind === 'bandwidth' ? f0 / 20 : f0;
  return {
    kind,
    stageId,
    node: doc.stages.length - 2,
    hz: fieldText(hasBand(kind) ? f0 * 0.98 : span, 'hertz'),
    stopHz: fieldText(f0 * 1.02, 'hertz'),
    db: DEFAULT_DB[kind],
    weight: 1,
  };
}

function quantity(text: string, unit: 'farad' | 'henry' | 'hertz', what: string): number {
  const r = parseQuantity(text, unit);
  if (!r.ok) throw new Error(`${what}: ${r.message}`);
  return r.value;
}

function goalSpec(g: GoalRow, n: number): OptimiserGoal {
  const weight = g.weight;
  const hz = () => quantity(g.hz, 'hertz', `goal ${n}`);
  const band = () => ({
    startHz: quantity(g.hz, 'hertz', `goal ${n}, from`),
    stopHz: quantity(g.stopHz, 'hertz', `goal ${n}, to`),
  });
  switch (g.kind) {
    case 'resonance':
      return { kind: 'resonance', stageId: g.stageId, targetHz: hz(), weight };
    case 'bandwidth':
      return { kind: 'bandwidth', node: g.node, targetHz: hz(), weight };
    case 'return-loss':
      return { kind: 'return-loss', ...band(), minDb: g.db, weight };
    case 'noise-figure':
      return { kind: 'noise-figure', maxDb: g.db, weight };
    case 'gain':
      return { kind: 'gain', targetDb: g.db, weight };
    case 'image-rejection':
      return { kind: 'image-rejection', minDb: g.db, weight };
    case 'ripple':
      return { kind: 'ripple', node: g.node, ...band(), maxDb: g.db, weight };
  }
}

/**
 * The optimiser's spec from the typed rows. Throws an Error whose message names the row
 * and says what to fix (a bound or frequency that does not read as a quantity).
 */
export function optimiserSpec(variables: VariableRow[], goals: GoalRow[]): StudySpecInput {
  const vars = variables.map((v, i) => ({
    stageId: v.stageId,
    key: v.key,
    min: quantity(v.min, unitOfKey(v.key), `value ${i + 1}, from`),
    max: quantity(v.max, unitOfKey(v.key), `value ${i + 1}, to`),
  }));
  if (vars.length === 0) throw new Error('Add a value to vary first.');
  return { kind: 'optimiser', variables: vars, goals: goals.map((g, i) => goalSpec(g, i + 1)) };
}
