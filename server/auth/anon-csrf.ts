import { createHmac, timingSafeEqual } from 'node:crypto';
import type { Request } from 'express';

/**
 * Where a signed-out visitor's CSRF token lives: a signed, HTTP-only cookie instead of the
 * session, so asking for a token stores no session row (a crawler or a sign-in page left
 * open would otherwise fill the table). After sign-in the token lives in the session.
 */
export const ANON_CSRF_COOKIE = 'cw_csrf';

/** One cookie's value from the Cookie header (values we set are URL-safe: no decoding). */
function cookieValue(header: string, name: string): string | undefined {
  for (const pair of header.split(';')) {
    const eq = pair.indexOf('=');
    if (eq > 0 && pair.slice(0, eq).trim() === name) return pair.slice(eq + 1).trim();
  }
  return undefined;
}

function sign(token: string, secret: string): string {
  return createHmac('sha256', secret).update(`csrf:${token}`).digest('base64url');
}

/** The token in the visitor's cookie, when its signature holds. */
export function readAnonToken(req: Request, secret: string): string | undefined {
  const raw = cookieValue(req.headers.cookie ?? '', ANON_CSRF_COOKIE);
  if (!raw) return undefined;
  const dot = raw.lastIndexOf('.');
  if (dot <= 0) return undefined;
  const token = raw.slice(0, dot);
  const given = Buffer.from(raw.slice(dot + 1));
  const expected = Buffer.from(sign(token, secret));
  return given.length === expected.length && timingSafeEqual(given, expected) ? token : undefined;
}

/** Sets (or with no token, clears) the visitor's cookie on the response. */
export function storeAnonToken(
  req: Request,
  token: string | null | undefined,
  secret: string,
  secure: boolean,
): void {
  const res = req.res;
  if (!res) return;
  if (!token) {
    res.clearCookie(ANON_CSRF_COOKIE, { path: '/' });
    return;
  }
  res.cookie(ANON_CSRF_COOKIE, `${token}.${sign(token, secret)}`, {
    httpOnly: true,
    sameSite: 'lax',
    secure,
    path: '/',
  });
}
