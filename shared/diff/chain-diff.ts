/**
 * What changed between two versions of a chain document: stages added, removed and moved
 * (matched by their stable ids), parameter values changed (old → new, with units), and
 * settings changed. Pure and framework-free: the server and the client can both use it.
 */
import type { ParamSpec, UnitKind } from '../engine/types';
import type { ChainDocument, StageInstance } from '../schema/chain';
import type { RevisionDiffDto, StageRefDto, ValueChangeDto, KeyFigureDto } from '../schema/api';
import { formatEngineering } from '../units/format';

/** The catalogue's parameters of a stage type (empty for an unknown type). */
export type ParamLookup = (type: string) => ParamSpec[];

type Value = number | string | boolean | null;

/** Significant figures of the diff's texts when the caller asks for none. */
const DEFAULT_DIFF_FIGURES = 3;

// Values the user typed are written rounded to the figures, never padded with zeros.
function show(value: Value, unit: UnitKind, digits: number): string {
  if (value === null || value === undefined) return '(none)';
  if (typeof value === 'number') return formatEngineering(value, unit, digits);
  return String(value);
}

const ref = (s: StageInstance, position: number): StageRefDto => ({
  id: s.id,
  type: s.type,
  label: s.label || s.type,
  position: position + 1,
});

/**
 * Stages present in both versions whose order among the kept stages changed. Kept stages
 * on the longest common subsequence of the two orders did not move; the others did (so one
 * stage dragged to the front is one move, not every stage shifted by one).
 */
function movedIds(before: string[], after: string[]): Set<string> {
  const n = before.length;
  const m = after.length;
  const lcs = Array.from({ length: n + 1 }, () => new Array<number>(m + 1).fill(0));
  for (let i = n - 1; i >= 0; i--) {
    for (let j = m - 1; j >= 0; j--) {
      lcs[i][j] =
        before[i] === after[j] ? lcs[i + 1][j + 1] + 1 : Math.max(lcs[i + 1][j], lcs[i][j + 1]);
    }
  }
  const stayed = new Set<string>();
  for (let i = 0, j = 0; i < n && j < m;) {
    if (before[i] === after[j]) {
      stayed.add(before[i]);
      i++;
      j++;
    } else if (lcs[i + 1][j] >= lcs[i][j + 1]) i++;
    else j++;
  }
  return new Set(before.filter((id) => !stayed.has(id)));
}

function valueChanges(
  a: StageInstance,
  b: StageInstance,
  params: ParamSpec[],
  digits: number,
): ValueChangeDto[] {
  const keys = new Set([...Object.keys(a.values), ...Object.keys(b.values)]);
  const out: ValueChangeDto[] = [];
  for (const key of keys) {
    const before = (a.values[key] ?? null) as Value;
    const after = (b.values[key] ?? null) as Value;
    if (before === after) continue;
    const spec = params.find((p) => p.key === key);
    const unit = spec?.unit ?? 'none';
    out.push({
      stageId: b.id,
      stageLabel: b.label || b.type,
      key,
      label: spec?.label ?? key,
      unit,
      before,
      after,
      beforeText: show(before, unit, digits),
      afterText: show(after, unit, digits),
    });
  }
  if ((a.dataFileId ?? null) !== (b.dataFileId ?? null)) {
    out.push({
      stageId: b.id,
      stageLabel: b.label || b.type,
      key: 'dataFileId',
      label: 'data file',
      unit: 'none',
      before: a.dataFileId ?? null,
      after: b.dataFileId ?? null,
      beforeText: a.dataFileId ?? '(none)',
      afterText: b.dataFileId ?? '(none)',
    });
  }
  if (a.label !== b.label) {
    out.push({
      stageId: b.id,
      stageLabel: b.label || b.type,
      key: 'label',
      label: 'name',
      unit: 'none',
      before: a.label,
      after: b.label,
      beforeText: a.label || '(none)',
      afterText: b.label || '(none)',
    });
  }
  return out;
}

/** Leaves of a settings object as dotted paths ("sweep.points"), arrays as one value. */
function flatten(obj: unknown, prefix = '', out = new Map<string, string>()): Map<string, string> {
  if (obj && typeof obj === 'object' && !Array.isArray(obj)) {
    for (const [k, v] of Object.entries(obj)) flatten(v, prefix ? `${prefix}.${k}` : k, out);
  } else {
    out.set(prefix, Array.isArray(obj) ? obj.join(', ') : String(obj));
  }
  return out;
}

/** Units of the settings shown with prefixes; the rest are plain numbers. */
const SETTING_UNITS: Record<string, UnitKind> = {
  f0Hz: 'hertz',
  'sweep.startHz': 'hertz',
  'sweep.stopHz': 'hertz',
  temperatureK: 'kelvin',
  channelBandwidthHz: 'hertz',
  requiredSnrDb: 'db',
  'thresholds.compressionBackoffDb': 'db',
  'thresholds.matchReturnLossDb': 'db',
};

function settingText(key: string, raw: string | undefined, digits: number): string {
  if (raw === undefined) return '(none)';
  const unit = SETTING_UNITS[key];
  const n = Number(raw);
  return unit && raw !== '' && Number.isFinite(n) ? formatEngineering(n, unit, digits) : raw;
}

/**
 * The document-level changes between `before` and `after` (no key figures). Values and
 * settings are written to `digits` significant figures, rounded as stated (not padded).
 */
export function diffChains(
  before: ChainDocument,
  after: ChainDocument,
  paramsOf: ParamLookup,
  digits = DEFAULT_DIFF_FIGURES,
): Omit<RevisionDiffDto, 'from' | 'to' | 'figures'> {
  const beforeById = new Map(before.stages.map((s, i) => [s.id, { s, i }]));
  const afterById = new Map(after.stages.map((s, i) => [s.id, { s, i }]));
  const added = after.stages.filter((s) => !beforeById.has(s.id));
  const removed = before.stages.filter((s) => !afterById.has(s.id));
  const keptBefore = before.stages.filter((s) => afterById.has(s.id)).map((s) => s.id);
  const keptAfter = after.stages.filter((s) => beforeById.has(s.id)).map((s) => s.id);
  const moved = movedIds(keptBefore, keptAfter);

  const values: ValueChangeDto[] = [];
  for (const s of after.stages) {
    const old = beforeById.get(s.id);
    if (!old) continue;
    if (old.s.type !== s.type) {
      values.push({
        stageId: s.id,
        stageLabel: s.label || s.type,
        key: 'type',
        label: 'stage type',
        unit: 'none',
        before: old.s.type,
        after: s.type,
        beforeText: old.s.type,
        afterText: s.type,
      });
    }
    values.push(...valueChanges(old.s, s, paramsOf(s.type), digits));
  }

  const sb = flatten(before.settings);
  const sa = flatten(after.settings);
  const settings: RevisionDiffDto['settings'] = [];
  for (const key of new Set([...sb.keys(), ...sa.keys()])) {
    if (sb.get(key) === sa.get(key)) continue;
    settings.push({
      key,
      before: settingText(key, sb.get(key), digits),
      after: settingText(key, sa.get(key), digits),
    });
  }
  if (before.name !== after.name)
    settings.push({ key: 'name', before: before.name, after: after.name });

  return {
    added: added.map((s) => ref(s, after.stages.indexOf(s))),
    removed: removed.map((s) => ref(s, before.stages.indexOf(s))),
    moved: after.stages
      .filter((s) => moved.has(s.id))
      .map((s) => ({ ...ref(s, afterById.get(s.id)!.i), from: beforeById.get(s.id)!.i + 1 })),
    values,
    settings,
  };
}

/** The figures of an analysis the diff compares (any may be missing when the engine refused). */
export interface FigureSource {
  levels: {
    totalGainDb: number;
    noiseFigureDb: number;
    noiseFloorDbm: number;
    sensitivityDbm: number;
    iip3Dbm: number | null;
    sfdrDb: number | null;
  };
  selectivity: { bw3dbHz: number | null }[];
  flags: { severity: string }[];
}

const FIGURES: {
  key: string;
  label: string;
  unit: UnitKind;
  pick: (a: FigureSource) => number | null;
  /** A count: written as a whole number at any figures ("2", never "2.000"). */
  count?: boolean;
}[] = [
  { key: 'totalGainDb', label: 'Total gain', unit: 'db', pick: (a) => a.levels.totalGainDb },
  { key: 'noiseFigureDb', label: 'Noise figure', unit: 'db', pick: (a) => a.levels.noiseFigureDb },
  {
    key: 'sensitivityDbm',
    label: 'Sensitivity',
    unit: 'dbm',
    pick: (a) => a.levels.sensitivityDbm,
  },
  { key: 'noiseFloorDbm', label: 'Noise floor', unit: 'dbm', pick: (a) => a.levels.noiseFloorDbm },
  { key: 'iip3Dbm', label: 'Input IP3', unit: 'dbm', pick: (a) => a.levels.iip3Dbm },
  { key: 'sfdrDb', label: 'Spurious-free dynamic range', unit: 'db', pick: (a) => a.levels.sfdrDb },
  {
    key: 'bw3dbHz',
    label: '−3 dB bandwidth (last node)',
    unit: 'hertz',
    pick: (a) => a.selectivity.at(-1)?.bw3dbHz ?? null,
  },
  {
    key: 'flags',
    label: 'Flags (warning or error)',
    unit: 'none',
    pick: (a) => a.flags.filter((f) => f.severity !== 'info').length,
    count: true,
  },
];

/**
 * The key figures before and after, formatted with their units. With `digits` (the user's
 * significant figures) they are results and keep their trailing zeros ("12.50 dB" at 4), as
 * the screens write results; without, 3 figures with the zeros dropped.
 */
export function keyFigures(
  before: FigureSource | null,
  after: FigureSource | null,
  digits?: number,
): KeyFigureDto[] {
  return FIGURES.map((f) => {
    const b = before ? f.pick(before) : null;
    const a = after ? f.pick(after) : null;
    const text = (v: number | null) => {
      if (v === null || !Number.isFinite(v)) return '—';
      if (f.count) return String(v);
      return digits === undefined
        ? formatEngineering(v, f.unit, DEFAULT_DIFF_FIGURES)
        : formatEngineering(v, f.unit, digits, true);
    };
    return {
      key: f.key,
      label: f.label,
      unit: f.unit,
      before: b,
      after: a,
      beforeText: text(b),
      afterText: text(a),
    };
  });
}
