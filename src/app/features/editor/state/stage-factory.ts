/** Turning catalogue entries into stage instances, and reading a stage's fields. */
import type { ParamSpec, ParamValues, StageTypeInfo } from '../../../../../shared/engine/types';
import type { StageInstance } from '../../../../../shared/schema/chain';
import { formatEngineering } from '../../../../../shared/units';

/** A short id, unique within a chain (the document limits ids to 64 characters). */
export function newStageId(): string {
  const random = globalThis.crypto?.randomUUID?.() ?? Math.random().toString(36).slice(2);
  return `s-${random.replace(/-/g, '').slice(0, 12)}`;
}

/** A new stage of `type` with every parameter at its catalogue default. */
export function createStage(type: StageTypeInfo, id = newStageId()): StageInstance {
  const values: ParamValues = {};
  for (const p of type.params) values[p.key] = p.default;
  return { id, type: type.type, label: type.label, values };
}

/** The value a stage has for `spec`, falling back to the catalogue default. */
export function valueOf(stage: StageInstance, spec: ParamSpec): number | string | boolean {
  return stage.values[spec.key] ?? spec.default;
}

/** Whether `spec` applies given the stage's other values (its `showWhen`). */
export function isParamShown(stage: StageInstance, spec: ParamSpec, all: ParamSpec[]): boolean {
  if (!spec.showWhen) return true;
  const controller = all.find((p) => p.key === spec.showWhen?.key);
  const current = controller ? valueOf(stage, controller) : stage.values[spec.showWhen.key];
  return current === spec.showWhen.equals;
}

/** The parameters the form shows for a stage, in catalogue order. */
export function visibleParams(stage: StageInstance, type: StageTypeInfo): ParamSpec[] {
  return type.params.filter((p) => isParamShown(stage, p, type.params));
}

/** The text an input starts with: what the user typed, or the value written out. */
export function displayText(stage: StageInstance, spec: ParamSpec): string {
  const entered = stage.entered?.[spec.key];
  if (entered !== undefined) return entered;
  const v = valueOf(stage, spec);
  return typeof v === 'number' ? formatEngineering(v, spec.unit, 6) : String(v);
}

/** A few "label value" pairs for the stage card: the first shown numeric parameters. */
export function keyValues(stage: StageInstance, type: StageTypeInfo, count = 3): string[] {
  return visibleParams(stage, type)
    .filter((p) => p.kind === 'number' || p.kind === 'enum')
    .slice(0, count)
    .map((p) => {
      const v = valueOf(stage, p);
      const text =
        typeof v === 'number'
          ? formatEngineering(v, p.unit)
          : (p.options?.find((o) => o.value === v)?.label ?? String(v));
      return `${shortLabel(p.label)} ${text}`;
    });
}

function shortLabel(label: string): string {
  return label.length > 18 ? `${label.slice(0, 17)}…` : label;
}

/** A stage with one parameter set; `entered` keeps the typed text, or loses it for non-text. */
export function withValue(
  stage: StageInstance,
  key: string,
  value: number | string | boolean,
  entered?: string,
): StageInstance {
  const next: StageInstance = { ...stage, values: { ...stage.values, [key]: value } };
  const texts = { ...(stage.entered ?? {}) };
  if (entered === undefined) delete texts[key];
  else texts[key] = entered;
  next.entered = Object.keys(texts).length > 0 ? texts : undefined;
  if (next.entered === undefined) delete next.entered;
  return next;
}

/** A stage with a preset's values applied; typed texts of those keys are dropped. */
export function withPreset(stage: StageInstance, values: ParamValues): StageInstance {
  let next = stage;
  for (const [key, value] of Object.entries(values)) next = withValue(next, key, value);
  return next;
}

/** A stage with a tolerance (percent) set or cleared. */
export function withTolerance(
  stage: StageInstance,
  key: string,
  percent: number | null,
): StageInstance {
  const tolerances = { ...(stage.tolerances ?? {}) };
  if (percent === null) delete tolerances[key];
  else tolerances[key] = percent;
  const next: StageInstance = { ...stage, tolerances };
  if (Object.keys(tolerances).length === 0) delete next.tolerances;
  return next;
}
