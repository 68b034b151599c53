import type { UnitKind } from '../../../../shared/engine/types';
import type { ChainDocument, StageInstance } from '../../../../shared/schema/chain';
import { nominalEngineering } from '../editor/results/format-quantity';

/** The unit of a stage type's value, from the catalogue; undefined when it is not known. */
export type UnitOf = (type: string, key: string) => UnitKind | undefined;

/** One variant's side of a differing stage. */
export interface StageDiffCell {
  /** "—" when the variant has no such stage; otherwise the values that differ. */
  text: string;
  /** Whether this variant differs from the first one here. */
  differs: boolean;
}

export interface StageDiffRow {
  stageId: string;
  label: string;
  cells: StageDiffCell[];
}

/** A stage's value as the cards write it: prefix and unit, rounded but not padded ("22 µH"). */
function textOf(v: unknown, unit: UnitKind | undefined): string {
  if (typeof v === 'number') return nominalEngineering(v, unit ?? 'none');
  return String(v);
}

/** Values of `stage` that differ from `other`'s (or all of them when `other` is absent). */
function differing(
  stage: StageInstance,
  other: StageInstance | undefined,
  unitOf: UnitOf,
): string[] {
  const valueText = (k: string, v: unknown) => `${k} ${textOf(v, unitOf(stage.type, k))}`;
  if (!other || other.type !== stage.type) {
    return [stage.type, ...Object.entries(stage.values).map(([k, v]) => valueText(k, v))];
  }
  const keys = new Set([...Object.keys(stage.values), ...Object.keys(other.values)]);
  return [...keys]
    .filter((k) => stage.values[k] !== other.values[k])
    .map((k) => (k in stage.values ? valueText(k, stage.values[k]) : `${k} —`));
}

/**
 * Which stages and values differ between variants, against the first: one row for each
 * stage (matched by id) that is absent, of another type or has another value in some
 * variant. Stages equal everywhere are left out.
 */
export function stageDiffRows(
  documents: (ChainDocument | null)[],
  unitOf: UnitOf = () => undefined,
): StageDiffRow[] {
  const docs = documents.map((d) => d?.stages ?? []);
  const ids: string[] = [];
  for (const stages of docs) for (const s of stages) if (!ids.includes(s.id)) ids.push(s.id);
  const rows: StageDiffRow[] = [];
  for (const id of ids) {
    const found = docs.map((stages) => stages.find((s) => s.id === id));
    const first = found[0];
    const cells = found.map((stage, i): StageDiffCell => {
      if (!stage) return { text: '—', differs: i > 0 && first !== undefined };
      if (i === 0) return { text: '', differs: false };
      const d = differing(stage, first, unitOf);
      return { text: d.join(', '), differs: d.length > 0 };
    });
    if (!cells.some((c) => c.differs)) continue;
    // The first variant's cell states what the others are compared with.
    if (first) {
      const others = found.filter((s, i) => i > 0 && s !== undefined) as StageInstance[];
      const keys = new Set(
        others.flatMap((o) => differing(o, first, unitOf).map((t) => t.split(' ')[0])),
      );
      cells[0].text =
        [...keys]
          .filter((k) => k in first.values)
          .map((k) => `${k} ${textOf(first.values[k], unitOf(first.type, k))}`)
          .join(', ') || first.type;
    }
    const named = found.find((s) => s) as StageInstance;
    rows.push({ stageId: id, label: named.label || named.type, cells });
  }
  return rows;
}
