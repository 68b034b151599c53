import type { ChainDocument, StageInstance } from '../../../../shared/schema/chain';

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

function valueText(v: unknown): string {
  if (typeof v === 'number') return Number(v.toPrecision(5)).toString();
  return String(v);
}

/** Values of `stage` that differ from `other`'s (or all of them when `other` is absent). */
function differing(stage: StageInstance, other: StageInstance | undefined): string[] {
  if (!other || other.type !== stage.type) {
    return [stage.type, ...Object.entries(stage.values).map(([k, v]) => `${k} ${valueText(v)}`)];
  }
  const keys = new Set([...Object.keys(stage.values), ...Object.keys(other.values)]);
  return [...keys]
    .filter((k) => stage.values[k] !== other.values[k])
    .map((k) => `${k} ${k in stage.values ? valueText(stage.values[k]) : '—'}`);
}

/**
 * Which stages and values differ between variants, against the first: one row for each
 * stage (matched by id) that is absent, of another type or has another value in some
 * variant. Stages equal everywhere are left out.
 */
export function stageDiffRows(documents: (ChainDocument | null)[]): StageDiffRow[] {
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
      const d = differing(stage, first);
      return { text: d.join(', '), differs: d.length > 0 };
    });
    if (!cells.some((c) => c.differs)) continue;
    // The first variant's cell states what the others are compared with.
    if (first) {
      const others = found.filter((s, i) => i > 0 && s !== undefined) as StageInstance[];
      const keys = new Set(others.flatMap((o) => differing(o, first).map((t) => t.split(' ')[0])));
      cells[0].text =
        [...keys]
          .filter((k) => k in first.values)
          .map((k) => `${k} ${valueText(first.values[k])}`)
          .join(', ') || first.type;
    }
    const named = found.find((s) => s) as StageInstance;
    rows.push({ stageId: id, label: named.label || named.type, cells });
  }
  return rows;
}
