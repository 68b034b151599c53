import { BreakpointObserver } from '@angular/cdk/layout';
import { Injectable, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { map } from 'rxjs';

/** Below this width the editor is laid out for a phone: one column, panels as sheets. */
export const PHONE_MAX_PX = 720;
/** Below this width (and above a phone) the editor is laid out for a tablet. */
export const TABLET_MAX_PX = 1279;

/**
 * The three layouts the pages are designed for, as signals: desktop (1280 px and wider),
 * tablet (about 1024) and phone (about 390). CSS media queries use the same limits.
 */
@Injectable({ providedIn: 'root' })
export class ScreenSize {
  private readonly observer = inject(BreakpointObserver);
  private readonly phoneQuery = `(max-width: ${PHONE_MAX_PX}px)`;
  private readonly tabletQuery = `(max-width: ${TABLET_MAX_PX}px)`;

  private readonly matches = toSignal(
    this.observer
      .observe([this.phoneQuery, this.tabletQuery])
      .pipe(map((state) => state.breakpoints)),
    { initialValue: {} as Record<string, boolean> },
  );

  readonly phone = computed(() => this.matches()[this.phoneQuery] === true);
  readonly tablet = computed(() => !this.phone() && this.matches()[this.tabletQuery] === true);
  readonly desktop = computed(() => !this.phone() && !this.tablet());
}
