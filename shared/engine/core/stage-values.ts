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

/** A bound or value in a message, in the parameter's unit. */
function inUnit(spec: ParamSpec, x: number): string {
  return formatQuantity(x, spec.unit, 6);
}

/**
 * Checks one value against its spec; returns the problem ("must be ...") or null. (No
 * closure per call: every value of every stage of every analysis is checked here.)
 */
function checkValue(spec: ParamSpec, v: unknown): string | null {
  switch (spec.kind) {
    case 'number':
      if (typeof v !== 'number') return `must be a number (got ${describe(v)})`;
      if (!Number.isFinite(v)) return `must be a finite number (got ${describe(v)})`;
      if (spec.min !== undefined && spec.max !== undefined) {
        // Name the whole range, so the message says what would be accepted.
        const low = spec.exclusiveMin ? !(v > spec.min) : !(v >= spec.min);
        if (low || !(v <= spec.max)) {
          const from = spec.exclusiveMin
            ? `above ${inUnit(spec, spec.min)}`
            : `from ${inUnit(spec, spec.min)}`;
          return `must be ${from} up to ${inUnit(spec, spec.max)} (got ${inUnit(spec, v)})`;
        }
        return null;
      }
      if (spec.min !== undefined) {
        if (spec.exclusiveMin && !(v > spec.min))
          return `must be above ${inUnit(spec, spec.min)} (got ${describe(v)})`;
        if (!spec.exclusiveMin && !(v >= spec.min))
          return `must be at least ${inUnit(spec, spec.min)} (got ${describe(v)})`;
      }
      if (spec.max !== undefined && !(v <= spec.max))
        return `must be at most ${inUnit(spec, spec.max)} (got ${describe(v)})`;
      return null;
    case 'enum': {
      const options = spec.options ?? [];
      if (typeof v === 'string') for (const o of options) if (o.value === v) return null;
      return `must be one of ${options.map((o) => o.value).join(', ')} (got ${describe(v)})`;
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
