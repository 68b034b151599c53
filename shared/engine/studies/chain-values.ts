/**
 * Reading and changing stage values of a chain document for studies, without touching the
 * caller's document.
 */
import type { ChainDocument } from '../../schema/chain';
import type { ValueRef } from '../../schema/studies';

/** A toleranced value of the chain: where it is, its nominal value and its ±%. */
export interface ToleranceEntry extends ValueRef {
  label: string;
  nominal: number;
  tolerancePct: number;
}

/** A copy of the document whose stages' `values` may be changed freely. */
export function cloneForEdit(doc: ChainDocument): ChainDocument {
  return {
    ...doc,
    settings: { ...doc.settings, sweep: { ...doc.settings.sweep } },
    stages: doc.stages.map((s) => ({ ...s, values: { ...s.values } })),
  };
}

/** The numeric value at `ref`, or an error saying what is wrong with the reference. */
export function readValue(doc: ChainDocument, ref: ValueRef): number {
  const stage = doc.stages.find((s) => s.id === ref.stageId);
  if (!stage) throw new StudySetupError(`the chain has no stage "${ref.stageId}"`);
  const v = stage.values[ref.key];
  if (typeof v !== 'number') {
    throw new StudySetupError(
      `stage "${stage.label || stage.id}" has no numeric value "${ref.key}" set: enter it in the editor first`,
    );
  }
  return v;
}

/** Sets the value at `ref` in a document from cloneForEdit. */
export function writeValue(doc: ChainDocument, ref: ValueRef, value: number): void {
  const stage = doc.stages.find((s) => s.id === ref.stageId);
  if (!stage) throw new StudySetupError(`the chain has no stage "${ref.stageId}"`);
  stage.values[ref.key] = value;
}

/** Every value with a tolerance above 0 %, in stage order. */
export function tolerancedValues(doc: ChainDocument): ToleranceEntry[] {
  const out: ToleranceEntry[] = [];
  for (const s of doc.stages) {
    for (const [key, pct] of Object.entries(s.tolerances ?? {})) {
      const v = s.values[key];
      if (!(pct > 0) || typeof v !== 'number') continue;
      out.push({
        stageId: s.id,
        key,
        label: `${s.label || s.id}: ${key}`,
        nominal: v,
        tolerancePct: pct,
      });
    }
  }
  return out;
}

/** A study that cannot run as asked (the message says what to change). */
export class StudySetupError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'StudySetupError';
  }
}
