/** Range checks against a parameter's schema, with the bounds written in its own units. */
import type { ParamSpec } from '../engine/types';
import { formatEngineering } from './format';

/** Returns a message when `value` is outside the spec's range, otherwise null. */
export function checkRange(
  value: number,
  spec: Pick<ParamSpec, 'min' | 'max' | 'exclusiveMin' | 'unit'>,
): string | null {
  const show = (v: number) => formatEngineering(v, spec.unit, 4);
  if (spec.min !== undefined) {
    if (spec.exclusiveMin && value <= spec.min) return `must be above ${show(spec.min)}`;
    if (!spec.exclusiveMin && value < spec.min) return `must be at least ${show(spec.min)}`;
  }
  if (spec.max !== undefined && value > spec.max) return `must be at most ${show(spec.max)}`;
  return null;
}
