import type { RequestHandler } from 'express';
import { ValidationError } from './errors';

/** Path of the first string in `value` holding a NUL character, or null. */
export function findNul(value: unknown, path: string[] = []): string[] | null {
  if (typeof value === 'string') return value.includes('\u0000') ? path : null;
  if (typeof value !== 'object' || value === null) return null;
  for (const [key, child] of Object.entries(value)) {
    if (key.includes('\u0000')) return [...path, key];
    const found = findNul(child, [...path, key]);
    if (found) return found;
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
