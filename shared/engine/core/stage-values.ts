/**
 * A stage's values checked against its type's parameter schema: defaults filled, hidden
 * values reset, and every value outside what the type accepts reported as an issue naming
 * the stage and the parameter. The chain schema knows only that a value is a number, a
 * string or a boolean; what each stage type accepts is the catalogue's, so it is checked here.
 */
import type { ChainIssue } from '../errors';
import type { ParamSpec, ParamValues, StageDefinition } from '../types';
import { formatQuantity } from './format';

function paramName(spec: ParamSpec): string {
  const l = spec.label || spec.key;
  // Lower-case only an ordinary first word ("Load resistance"); keep "IIP3", "LO frequency",
  // "S-parameter points" and "Q of the coil" as written.
  const second = l.charAt(1);
  return second && second !== second.toUpperCase() ? l[0].toLowerCase() + l.slice(1) : l;
}

function showParam(spec: ParamSpec, resolved: ParamValues): boolean {
  return !spec.showWhen || resolved[spec.showWhen.key] === spec.showWhen.equals;
}

function describe(v: unknown): string {
  return typeof v === 'string' ? JSON.stringify(v) : String(v);
}

/** Checks one value against its spec; returns the problem ("must be ...") or null. */
function checkValue(spec: ParamSpec, v: unknown): string | null {
  const unit = (x: number) => formatQuantity(x, spec.unit, 6);
  switch (spec.kind) {
    case 'number':
      if (typeof v !== 'number') return `must be a number (got ${describe(v)})`;
      if (!Number.isFinite(v)) return `must be a finite number (got ${describe(v)})`;
      if (spec.min !== undefined && spec.max !== undefined) {
        // Name the whole range, so the message says what would be accepted.
        const low = spec.exclusiveMin ? !(v > spec.min) : !(v >= spec.min);
        if (low || !(v <= spec.max)) {
          const from = spec.exclusiveMin ? `above ${unit(spec.min)}` : `from ${unit(spec.min)}`;
          return `must be ${from} up to ${unit(spec.max)} (got ${unit(v)})`;
        }
        return null;
      }
      if (spec.min !== undefined) {
        if (spec.exclusiveMin && !(v > spec.min))
          return `must be above ${unit(spec.min)} (got ${describe(v)})`;
        if (!spec.exclusiveMin && !(v >= spec.min))
          return `must be at least ${unit(spec.min)} (got ${describe(v)})`;
      }
      if (spec.max !== undefined && !(v <= spec.max))
        return `must be at most ${unit(spec.max)} (got ${describe(v)})`;
      return null;
    case 'enum': {
      const allowed = (spec.options ?? []).map((o) => o.value);
      if (typeof v !== 'string' || !allowed.includes(v))
        return `must be one of ${allowed.join(', ')} (got ${describe(v)})`;
      return null;
    }
    case 'boolean':
      return typeof v === 'boolean' ? null : `must be true or false (got ${describe(v)})`;
    case 'text':
      if (typeof v !== 'string') return `must be text (got ${describe(v)})`;
      return v.length <= 200 ? null : `must be at most 200 characters (got ${v.length})`;
  }
  return `has a kind the engine does not know ("${String(spec.kind)}")`;
}

/** Resolves a stage's values (defaults filled, hidden ones reset) and reports bad ones. */
export function resolveValues(
  def: StageDefinition,
  given: Readonly<ParamValues>,
  where: { index: number; id: string; name: string },
  issues: ChainIssue[],
): ParamValues {
  const resolved: ParamValues = {};
  for (const spec of def.params) {
    const v = given[spec.key];
    resolved[spec.key] = v === undefined ? spec.default : v;
  }
  for (const spec of def.params) {
    if (!showParam(spec, resolved)) {
      resolved[spec.key] = spec.default; // hidden: neither checked nor used
      continue;
    }
    const problem = checkValue(spec, resolved[spec.key]);
    if (problem) {
      issues.push({
        stageId: where.id,
        stageIndex: where.index,
        param: spec.key,
        path: ['stages', where.index, 'values', spec.key],
        message: `${where.name}: ${paramName(spec)} ${problem}`,
      });
    }
  }
  return resolved;
}
