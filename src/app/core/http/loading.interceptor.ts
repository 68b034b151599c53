import { HttpInterceptorFn } from '@angular/common/http';
import { computed, inject, Injectable, signal } from '@angular/core';
import { finalize } from 'rxjs';
import { SKIP_LOADING_BAR } from './http-context';

/** Counts requests in flight so the shell can show a progress bar while any run. */
@Injectable({ providedIn: 'root' })
export class LoadingTracker {
  private readonly inFlight = signal(0);
  /** Whether at least one request is running. */
  readonly busy = computed(() => this.inFlight() > 0);

  started(): void {
    this.inFlight.update((n) => n + 1);
  }

  finished(): void {
    this.inFlight.update((n) => Math.max(0, n - 1));
  }
}

export const loadingInterceptor: HttpInterceptorFn = (req, next) => {
  if (req.context.get(SKIP_LOADING_BAR)) return next(req);
  const tracker = inject(LoadingTracker);
  tracker.started();
  return next(req).pipe(finalize(() => tracker.finished()));
};
