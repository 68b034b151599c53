import type { RequestHandler } from 'express';
import { ValidationError } from './errors';

/**
 * Path of the first string in `value` holding a NUL character, or null. Walks with a stack
 * of its own, not recursion, so no body shape can exhaust the call stack (the JSON parser
 * also bounds nesting, see json-body.ts).
 */
export function findNul(value: unknown): string[] | null {
  const pending: { value: unknown; path: string[] }[] = [{ value, path: [] }];
  while (pending.length > 0) {
    const { value: current, path } = pending.pop()!;
    if (typeof current === 'string') {
      if (current.includes('\u0000')) return path;
      continue;
    }
    if (typeof current !== 'object' || current === null) continue;
    const entries = Object.entries(current);
    // Pushed in reverse so the first key is looked at first, as a reader would.
    for (let i = entries.length - 1; i >= 0; i--) {
      const [key, child] = entries[i];
      if (key.includes('\u0000')) return [...path, key];
      pending.push({ value: child, path: [...path, key] });
    }
  }
  return null;
}

/**
 * PostgreSQL cannot store NUL (U+0000) in text or JSONB, so a body carrying one would fail
 * at the database. Refuse it up front with the field at fault.
 */
export const rejectNulCharacters: RequestHandler = (req, _res, next) => {
  const path = findNul(req.body);
  if (path) {
    const where = path.join('.') || '(body)';
    throw new ValidationError(`${where}: text may not contain the NUL character (U+0000)`, [
      { path: where, message: 'text may not contain the NUL character (U+0000)' },
    ]);
  }
  next();
};
