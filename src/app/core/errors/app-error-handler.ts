import { HttpErrorResponse } from '@angular/common/http';
import { ErrorHandler, inject, Injectable, NgZone } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';

/**
 * The last stop for errors nobody caught. HTTP failures were already reported by the
 * error interceptor, so they are only logged; anything else is a bug in the client, so
 * the user is told in plain words and the details go to the console.
 */
@Injectable()
export class AppErrorHandler implements ErrorHandler {
  private readonly snackBar = inject(MatSnackBar);
  private readonly zone = inject(NgZone);

  handleError(error: unknown): void {
    const cause = unwrap(error);
    if (cause instanceof HttpErrorResponse) {
      console.warn('Unhandled HTTP error', cause.status, cause.url);
      return;
    }
    console.error(cause);
    this.zone.run(() =>
      this.snackBar.open(
        'Something went wrong in this page. Reload it; your saved work is safe.',
        'Dismiss',
        { duration: 10000 },
      ),
    );
  }
}

/** Promise rejections arrive wrapped; report what was actually thrown. */
function unwrap(error: unknown): unknown {
  const inner = (error as { rejection?: unknown } | null)?.rejection;
  return inner ?? error;
}
