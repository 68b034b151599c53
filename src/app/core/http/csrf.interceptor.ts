import { HttpErrorResponse, HttpInterceptorFn, HttpRequest } from '@angular/common/http';
import { inject } from '@angular/core';
import { catchError, from, switchMap, throwError } from 'rxjs';
import { CsrfTokenStore } from './csrf-token.store';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** Only our own API gets the token; never send it to another origin. */
function needsToken(req: HttpRequest<unknown>): boolean {
  return !SAFE_METHODS.has(req.method) && req.url.startsWith('/api/');
}

function isCsrfRejection(error: unknown): boolean {
  if (!(error instanceof HttpErrorResponse) || error.status !== 403) return false;
  const code = (error.error as { error?: unknown } | null)?.error;
  return typeof code === 'string' && code.toLowerCase().includes('csrf');
}

/**
 * Adds `x-csrf-token` to every state-changing request to /api. When the server rejects
 * the token (the session expired or changed in another tab) it fetches a new one and
 * retries once.
 */
export const csrfInterceptor: HttpInterceptorFn = (req, next) => {
  if (!needsToken(req)) return next(req);
  const tokens = inject(CsrfTokenStore);
  const send = () =>
    from(tokens.get()).pipe(
      switchMap((token) => next(req.clone({ setHeaders: { 'x-csrf-token': token } }))),
    );
  return send().pipe(
    catchError((error: unknown) => {
      if (!isCsrfRejection(error)) return throwError(() => error);
      tokens.clear();
      return send();
    }),
  );
};
