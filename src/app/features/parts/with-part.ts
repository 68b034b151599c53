/**
 * Taking a stage value from the parts bin: the value itself, the part's tolerance into the
 * stage's tolerances, its Q into the stage's Q of that component, and a reference to the
 * part, so the editor shows where the value came from. Pure functions over the document.
 */
import type { ParamSpec } from '../../../../shared/engine/types';
import type { PartDto } from '../../../../shared/schema/api';
import type { PartRef, StageInstance } from '../../../../shared/schema/chain';
import { fieldText, nominal, nominalEngineering } from '../editor/results/format-quantity';
import { withTolerance, withValue } from '../editor/state/stage-factory';

/**
 * The Q parameter that holds the loss of the component at `key`: a coil "l" or "l1" has
 * "ql"/"q1"/"q", a capacitor "c" or "c1" has "qc". Null when the type has none (the part's
 * Q is then kept in the reference only).
 */
export function qKeyFor(params: readonly ParamSpec[], spec: ParamSpec): string | null {
  const suffix = spec.key.replace(/^[a-z]+/i, '');
  const candidates =
    spec.unit === 'henry' ? [`q${suffix}`, `ql${suffix}`, 'ql', 'q'] : [`qc${suffix}`, 'qc'];
  for (const key of candidates) {
    if (params.some((p) => p.key === key && p.unit === 'ratio')) return key;
  }
  return null;
}

/** The stage with `part` taken for the value at `spec`. */
export function withPart(
  stage: StageInstance,
  spec: ParamSpec,
  params: readonly ParamSpec[],
  part: PartDto,
): StageInstance {
  const unit = part.kind === 'inductor' ? 'henry' : 'farad';
  // The field's text: enough figures to read back as the part's value exactly.
  let next = withValue(stage, spec.key, part.value, fieldText(part.value, unit));
  if (spec.tolerance) next = withTolerance(next, spec.key, part.tolerancePct);
  const qKey = qKeyFor(params, spec);
  if (qKey && part.q !== null) next = withValue(next, qKey, part.q);
  const ref: PartRef = { partId: part.id, partNumber: part.partNumber };
  if (part.q !== null) ref.q = part.q;
  if (part.qFreqHz !== null) ref.qFreqHz = part.qFreqHz;
  if (part.tolerancePct !== null) ref.tolerancePct = part.tolerancePct;
  return { ...next, parts: { ...(stage.parts ?? {}), [spec.key]: ref } };
}

/** The stage without a part reference at `key` (its value was typed over). */
export function withoutPart(stage: StageInstance, key: string): StageInstance {
  if (!stage.parts?.[key]) return stage;
  const { [key]: _dropped, ...rest } = stage.parts;
  const next: StageInstance = { ...stage, parts: rest };
  if (Object.keys(rest).length === 0) delete next.parts;
  return next;
}

/** One line for the field: "From the bin: C-100P, Q 500 at 10 MHz, ± 5 %". */
export function describePartRef(ref: PartRef): string {
  const bits = [ref.partNumber || 'a part'];
  if (ref.q !== undefined) {
    const at = ref.qFreqHz === undefined ? '' : ` at ${nominalEngineering(ref.qFreqHz, 'hertz')}`;
    bits.push(`Q ${ref.q}${at}`);
  }
  if (ref.tolerancePct !== undefined) bits.push(`± ${nominal(ref.tolerancePct)} %`);
  return `From the bin: ${bits.join(', ')}`;
}
