import {
  HttpErrorResponse,
  type HttpEvent,
  HttpInterceptorFn,
  HttpRequest,
} from '@angular/common/http';
import { inject } from '@angular/core';
import { catchError, defer, from, switchMap, throwError, type Observable } from 'rxjs';
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
 * retries once. A token already held goes on the request at once, in the same task: only a
 * missing one is waited for, so an edit's analysis leaves without a turn of the event loop.
 */
export const csrfInterceptor: HttpInterceptorFn = (req, next) => {
  if (!needsToken(req)) return next(req);
  const tokens = inject(CsrfTokenStore);
  const withToken = (token: string) => next(req.clone({ setHeaders: { 'x-csrf-token': token } }));
  const send = (): Observable<HttpEvent<unknown>> =>
    defer(() => {
      const held = tokens.held();
      return held ? withToken(held) : from(tokens.get()).pipe(switchMap(withToken));
    });
  return send().pipe(
    catchError((error: unknown) => {
      if (!isCsrfRejection(error)) return throwError(() => error);
      tokens.clear();
      return send();
    }),
  );
};
