import { HttpErrorResponse, HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import { catchError, throwError } from 'rxjs';
import { SessionStore } from '../session/session.store';
import { describeHttpError } from './error-message';
import { isSnackbarSkipped, SKIP_ERROR_SNACKBAR } from './http-context';

/**
 * Shows the server's message in a snackbar for every failed request, unless the caller
 * opted out with SKIP_ERROR_SNACKBAR. A 401 means the session ended: forget who was
 * signed in and go to the sign-in page, coming back here afterwards.
 */
export const errorInterceptor: HttpInterceptorFn = (req, next) => {
  const snackBar = inject(MatSnackBar);
  const router = inject(Router);
  const session = inject(SessionStore);
  return next(req).pipe(
    catchError((error: unknown) => {
      const status = error instanceof HttpErrorResponse ? error.status : -1;
      if (!isSnackbarSkipped(req.context.get(SKIP_ERROR_SNACKBAR), status)) {
        snackBar.open(describeHttpError(error), 'Dismiss', { duration: 8000 });
        if (status === 401) {
          session.forget();
          const here = router.url;
          const next = here.startsWith('/sign-in') ? undefined : here;
          void router.navigate(['/sign-in'], { queryParams: next ? { next } : {} });
        }
      }
      return throwError(() => error);
    }),
  );
};
