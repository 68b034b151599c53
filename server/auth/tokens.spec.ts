import crypto from 'node:crypto';
import { hashToken, looksLikeToken, newToken, tokenMatches } from './tokens';

describe('link tokens', () => {
  it('should make 43-character base64url tokens and keep only their SHA-256', () => {
    const { token, hash } = newToken();
    expect(looksLikeToken(token)).toBe(true);
    expect(hash).toMatch(/^[0-9a-f]{64}$/);
    expect(hash).toBe(crypto.createHash('sha256').update(token).digest('hex'));
    expect(hash).not.toContain(token);
    expect(newToken().token).not.toBe(token);
  });

  it('should compare a token with a stored hash in constant time', () => {
    const { token, hash } = newToken();
    const compare = jest.spyOn(crypto, 'timingSafeEqual');
    try {
      expect(tokenMatches(token, hash)).toBe(true);
      expect(tokenMatches(newToken().token, hash)).toBe(false);
      expect(compare).toHaveBeenCalledTimes(2);
      // A stored value of another length never matches (and is not compared).
      expect(tokenMatches(token, hash.slice(2))).toBe(false);
      expect(compare).toHaveBeenCalledTimes(2);
    } finally {
      compare.mockRestore();
    }
  });

  it('should refuse path segments that cannot be tokens before any lookup', () => {
    expect(looksLikeToken('x'.repeat(42))).toBe(false);
    expect(looksLikeToken(`${'x'.repeat(42)}/`)).toBe(false);
    expect(looksLikeToken(undefined)).toBe(false);
    expect(hashToken('a')).toHaveLength(64);
  });
});
