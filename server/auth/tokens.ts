import { createHash, randomBytes, timingSafeEqual } from 'node:crypto';

/**
 * Secrets sent by mail or in links (invitations, password resets, address confirmations,
 * read-only links). Only a SHA-256 of each is stored, so a copy of the database opens
 * nothing; 32 random bytes make guessing hopeless.
 */
export function newToken(): { token: string; hash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, hash: hashToken(token) };
}

/** The stored form of a token. */
export function hashToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/** Whether a token's hash equals a stored one, compared in constant time. */
export function tokenMatches(token: string, storedHash: string): boolean {
  const a = Buffer.from(hashToken(token), 'hex');
  const b = Buffer.from(storedHash, 'hex');
  return a.length === b.length && timingSafeEqual(a, b);
}

/** Whether a path segment can be a token at all (base64url, 43 characters). */
export function looksLikeToken(value: unknown): value is string {
  return typeof value === 'string' && /^[A-Za-z0-9_-]{43}$/.test(value);
}
