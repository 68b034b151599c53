/**
 * The comparison table: one row per quantity, one cell per variant, built from each
 * variant's analysis. Pure, so the rows and the best-value marking are tested directly.
 */
import type { AnalysisResult, SelectivityReport } from '../../../../shared/engine/types';
import {
  NO_VALUE,
  decibels,
  engineering,
  nominalEngineering,
  plain,
} from '../editor/results/format-quantity';

/** Which way a row improves; `none` rows show values side by side without a winner. */
export type Better = 'higher' | 'lower' | 'none';

/** One variant of the comparison: its name and its analysis (null while loading or failed). */
export interface CompareVariant {
  id: string;
  name: string;
  result: AnalysisResult | null;
}

export interface CompareCell {
  /** The value compared (SI or dB); null when the engine has none. */
  value: number | null;
  text: string;
  best: boolean;
}

export interface CompareRow {
  key: string;
  label: string;
  better: Better;
  /** Says how the row is read, e.g. "higher is better". */
  hint: string;
  cells: CompareCell[];
}

interface RowSpec {
  key: string;
  label: string;
  better: Better;
  hint?: string;
  value: (r: AnalysisResult) => number | null;
  format: (v: number | null) => string;
}

/** Selectivity at the last node (the detector or converter input). */
export function lastNodeSelectivity(result: AnalysisResult): SelectivityReport | null {
  const last = result.nodes.length - 1;
  return (
    result.selectivity.find((s) => s.node === last) ??
    result.selectivity[result.selectivity.length - 1] ??
    null
  );
}

const flagsOf = (r: AnalysisResult, severity: 'warning' | 'error') =>
  r.flags.filter((f) => f.severity === severity).length;

const dbText = (v: number | null) => decibels(v);
const dbmText = (v: number | null) => decibels(v, 'dBm');
const hzText = (v: number | null) => engineering(v, 'hertz');
const statedHz = (v: number | null) => nominalEngineering(v, 'hertz');
const countText = (v: number | null) => (v === null ? NO_VALUE : String(v));

const ROWS: RowSpec[] = [
  // The design frequency is the user's: written as stated ("7.2 MHz", not "7.200 MHz").
  { key: 'f0', label: 'f₀', better: 'none', value: (r) => r.f0Hz, format: statedHz },
  {
    key: 'stages',
    label: 'Stages between source and load',
    better: 'none',
    value: (r) => r.stages.length,
    format: countText,
  },
  {
    key: 'gain',
    label: 'Total gain',
    better: 'higher',
    value: (r) => r.levels.totalGainDb,
    format: dbText,
  },
  {
    key: 'nf',
    label: 'Noise figure',
    better: 'lower',
    value: (r) => r.levels.noiseFigureDb,
    format: dbText,
  },
  {
    key: 'sensitivity',
    label: 'Sensitivity',
    better: 'lower',
    hint: 'lower (weaker signal) is better',
    value: (r) => r.levels.sensitivityDbm,
    format: dbmText,
  },
  {
    key: 'iip3',
    label: 'Input IP3',
    better: 'higher',
    value: (r) => r.levels.iip3Dbm,
    format: dbmText,
  },
  { key: 'sfdr', label: 'SFDR', better: 'higher', value: (r) => r.levels.sfdrDb, format: dbText },
  {
    key: 'bw3',
    label: '−3 dB bandwidth (last node)',
    better: 'none',
    hint: 'set by the channel: no winner',
    value: (r) => lastNodeSelectivity(r)?.bw3dbHz ?? null,
    format: hzText,
  },
  {
    key: 'bw60',
    label: '−60 dB bandwidth (last node)',
    better: 'lower',
    hint: 'narrower skirts are better',
    value: (r) => lastNodeSelectivity(r)?.bw60dbHz ?? null,
    format: hzText,
  },
  {
    key: 'shape',
    label: 'Shape factor 60/3 (last node)',
    better: 'lower',
    hint: 'closer to 1 is better',
    value: (r) => lastNodeSelectivity(r)?.shapeFactor ?? null,
    format: (v) => plain(v),
  },
  {
    key: 'image',
    label: 'Image rejection',
    better: 'higher',
    value: (r) => lastNodeSelectivity(r)?.imageRejectionDb ?? null,
    format: dbText,
  },
  {
    key: 'worstSpur',
    label: 'Weakest spurious rejection (plan)',
    better: 'higher',
    hint: 'the image or spur the chain rejects least',
    value: (r) => r.plan?.spurs[0]?.rejectionDb ?? null,
    format: dbText,
  },
  {
    key: 'offIip3',
    label: 'Off-channel IIP3 (plan)',
    better: 'higher',
    hint: 'for the chain’s tone spacing',
    value: (r) => r.plan?.intermod.effectiveIip3Dbm ?? null,
    format: dbmText,
  },
  {
    key: 'desense',
    label: 'Desensitisation by the blocker (plan)',
    better: 'lower',
    value: (r) => r.plan?.blocking.desensitisationDb ?? null,
    format: dbText,
  },
  {
    key: 'outside',
    label: 'Outside noise above the receiver’s (plan)',
    better: 'none',
    hint: 'set by the site and the frequency',
    value: (r) => r.plan?.externalNoise.externalAboveReceiverDb ?? null,
    format: dbText,
  },
  {
    key: 'adcHeadroom',
    label: 'Converter headroom (plan)',
    better: 'higher',
    value: (r) => r.plan?.converter?.headroomDb ?? null,
    format: dbText,
  },
  {
    key: 'errors',
    label: 'Flags: errors',
    better: 'lower',
    value: (r) => flagsOf(r, 'error'),
    format: countText,
  },
  {
    key: 'warnings',
    label: 'Flags: warnings',
    better: 'lower',
    value: (r) => flagsOf(r, 'warning'),
    format: countText,
  },
];

const DEFAULT_HINT: Record<Better, string> = {
  higher: 'higher is better',
  lower: 'lower is better',
  none: 'no better direction',
};

/**
 * Indexes of the best values among `values` in the direction `better`: all ties, none when
 * fewer than two values are known or all known values are equal (nothing to choose).
 */
export function bestIndexes(values: (number | null)[], better: Better): number[] {
  if (better === 'none') return [];
  const known = values.flatMap((v, i) => (v === null || Number.isNaN(v) ? [] : [[v, i] as const]));
  if (known.length < 2) return [];
  const pick = better === 'higher' ? Math.max : Math.min;
  const target = pick(...known.map(([v]) => v));
  // Values equal to display precision tie; compare relative to the larger magnitude.
  const close = (v: number) =>
    v === target || Math.abs(v - target) <= 1e-9 * Math.max(Math.abs(v), Math.abs(target));
  const winners = known.filter(([v]) => close(v)).map(([, i]) => i);
  return winners.length === known.length ? [] : winners;
}

/** The loaded Q of every resonator of a result, as "label Q" pairs. */
export function loadedQText(result: AnalysisResult): string {
  const parts = result.resonators.map((r) => `${r.label} ${plain(r.loadedQ)}`);
  return parts.length ? parts.join(' · ') : NO_VALUE;
}

/** The table rows for the variants, in their order; a variant without a result shows "—". */
export function compareRows(variants: CompareVariant[]): CompareRow[] {
  const rows = ROWS.map((spec): CompareRow => {
    const values = variants.map((v) => (v.result ? spec.value(v.result) : null));
    const best = new Set(bestIndexes(values, spec.better));
    return {
      key: spec.key,
      label: spec.label,
      better: spec.better,
      hint: spec.hint ?? DEFAULT_HINT[spec.better],
      cells: values.map((value, i) => ({
        value,
        text: variants[i].result ? spec.format(value) : NO_VALUE,
        best: best.has(i),
      })),
    };
  });
  const q: CompareRow = {
    key: 'loadedQ',
    label: 'Loaded Q of each resonator',
    better: 'none',
    hint: 'one value per tank: read side by side',
    cells: variants.map((v) => ({
      value: null,
      text: v.result ? loadedQText(v.result) : NO_VALUE,
      best: false,
    })),
  };
  // Loaded Q sits with the selectivity rows, before the flags.
  const at = rows.findIndex((r) => r.key === 'errors');
  return [...rows.slice(0, at), q, ...rows.slice(at)];
}
