/**
 * The `?next=` target if it is a path inside this app. Anything else (another origin,
 * a protocol-relative URL, the sign-in page itself) is dropped so a crafted link cannot
 * send a user elsewhere after signing in.
 */
export function safeReturnUrl(next: string | null | undefined): string | null {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) {
    return null;
  }
  if (next.startsWith('/sign-in') || next.startsWith('/register')) return null;
  return next;
}
