/** Turning catalogue entries into stage instances, and reading a stage's fields. */
import type { ParamSpec, ParamValues, StageTypeInfo } from '../../../../../shared/engine/types';
import type { StageInstance } from '../../../../../shared/schema/chain';
import { formatEngineering } from '../../../../../shared/units';
import { significantFigures } from '../../../core/format/number-format';

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

/** One value a stage card shows: the parameter's full label and its value with units. */
export interface CardValue {
  key: string;
  label: string;
  value: string;
  /** A number with its unit (kept on one line), not the words of a choice. */
  numeric: boolean;
}

/** Parts come first on a card: they are what a stage is built from. */
const PART_UNITS = new Set(['henry', 'farad']);

/**
 * The values that define a stage, for its card: the shown component values (inductances,
 * capacitances) first, then the other numbers and choices in catalogue order. The switch
 * that says how values are entered (`mode`) is left out: it is a way of entering, not a
 * value of the stage. Labels are given in full; the card wraps them.
 */
export function keyValues(
  stage: StageInstance,
  type: StageTypeInfo,
  count = 4,
  designed?: Record<string, number>,
): CardValue[] {
  // A network entered by design: the parts the design chose lead, from the analysis.
  const designedParts: CardValue[] = type.params
    .filter((p) => designed?.[p.key] !== undefined && !isParamShown(stage, p, type.params))
    .map((p) => ({
      key: p.key,
      label: `${p.label} (designed)`,
      value: formatEngineering(designed![p.key], p.unit, significantFigures(), true),
      numeric: true,
    }));
  const candidates = visibleParams(stage, type).filter(
    (p) => (p.kind === 'number' || p.kind === 'enum') && p.key !== 'mode',
  );
  const parts = candidates.filter((p) => PART_UNITS.has(p.unit));
  const rest = candidates.filter((p) => !PART_UNITS.has(p.unit));
  const entered = [...parts, ...rest].slice(0, Math.max(0, count - designedParts.length));
  return [
    ...designedParts,
    ...entered.map((p) => {
      const v = valueOf(stage, p);
      const value =
        typeof v === 'number'
          ? // A value the user stated: rounded, not padded ("22 µH", not "22.00 µH").
            formatEngineering(v, p.unit, significantFigures())
          : (p.options?.find((o) => o.value === v)?.label ?? String(v));
      return { key: p.key, label: p.label, value, numeric: typeof v === 'number' };
    }),
  ];
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
