import type { RequestHandler } from 'express';
import { ValidationError } from './errors';
import { bodyMayHoldNul } from './json-body';

interface Pending {
  value: unknown;
  key: string;
  parent: Pending | null;
}

function pathOf(entry: Pending | null, last?: string): string[] {
  const path = last === undefined ? [] : [last];
  for (let at = entry; at?.parent; at = at.parent) path.push(at.key);
  return path.reverse();
}

/**
 * Path of the first string in `value` holding a NUL character, or null. Walks with a stack
 * of its own, not recursion, so no body shape can exhaust the call stack (the JSON parser
 * also bounds nesting, see json-body.ts).
 */
export function findNul(value: unknown): string[] | null {
  // Each entry links to its parent; a path is spelled out only for the string found.
  const pending: Pending[] = [{ value, key: '', parent: null }];
  while (pending.length > 0) {
    const entry = pending.pop()!;
    const current = entry.value;
    if (typeof current === 'string') {
      if (current.includes('\u0000')) return pathOf(entry);
      continue;
    }
    if (typeof current !== 'object' || current === null) continue;
    const keys = Object.keys(current);
    // Pushed in reverse so the first key is looked at first, as a reader would.
    for (let i = keys.length - 1; i >= 0; i--) {
      const key = keys[i];
      if (key.includes('\u0000')) return pathOf(entry, key);
      pending.push({ value: (current as Record<string, unknown>)[key], key, parent: entry });
    }
  }
  return null;
}

/**
 * PostgreSQL cannot store NUL (U+0000) in text or JSONB, so a body carrying one would fail
 * at the database. Refuse it up front with the field at fault. A JSON body whose raw bytes
 * hold no `\u0000` escape (the JSON parser's scan, ./json-body.ts) is not walked.
 */
export const rejectNulCharacters: RequestHandler = (req, _res, next) => {
  const path = bodyMayHoldNul(req) ? findNul(req.body) : null;
  if (path) {
    const where = path.join('.') || '(body)';
    throw new ValidationError(`${where}: text may not contain the NUL character (U+0000)`, [
      { path: where, message: 'text may not contain the NUL character (U+0000)' },
    ]);
  }
  next();
};
