/**
 * Draws the plots of a page one at a time, those in view first, with a painted frame after
 * each. Plotly draws a figure in one long task (tens of milliseconds for 2,001 points), so
 * four plots drawn together keep the first one off the screen until the last is done. Here
 * the plot a person is looking at is painted first; plots below the fold follow when the
 * browser is idle (within a second at the latest), so typing is not held up by plots no one
 * sees. A plot just below the window (within `NEAR_VIEW_PX`) counts as in view: it is the
 * next thing scrolled to, and an idle moment there would come while the person reads the plot
 * above. A plot that asks again before its turn keeps its place with the newer drawing.
 *
 * While the page waits for an answer that will replace the figures (`holdOffScreen(true)`,
 * the editor's analysis in flight), plots out of view are not drawn: the browser is idle
 * during the wait, and a long drawing of a figure about to be replaced would hold up the plot
 * in view when the answer lands. They are drawn, with the newest figure, once it is released.
 */
import { DOCUMENT, Injectable, inject } from '@angular/core';

/** What a plot asks to have done in its turn. */
export interface PlotDrawJob {
  /** The element whose place on the page decides the order. */
  element: HTMLElement;
  /** Draws; the next plot waits for the returned promise and a painted frame. */
  draw: () => Promise<unknown>;
}

/** How long an off-screen plot may wait for an idle moment, ms. */
export const OFF_SCREEN_WAIT_MS = 1000;
/** How long the queue waits for one drawing before it goes on with the next, ms. */
export const DRAW_WAIT_MS = 3000;
/** How far below the window a plot still counts as in view, px. */
export const NEAR_VIEW_PX = 200;

interface QueueWindow {
  innerHeight: number;
  requestAnimationFrame?: (callback: () => void) => number;
  requestIdleCallback?: (callback: () => void, options?: { timeout: number }) => number;
  setTimeout: (callback: () => void, ms: number) => unknown;
}

@Injectable({ providedIn: 'root' })
export class PlotDrawQueue {
  private readonly view = inject(DOCUMENT).defaultView as QueueWindow | null;
  /** Waiting jobs by owner, in the order the owners first asked (the page's order). */
  private readonly waiting = new Map<unknown, PlotDrawJob>();
  /** A drawing is under way (until the frame after it is painted). */
  private drawing = false;
  /** The owner of the drawing under way and how to end its turn early. */
  private current: { owner: unknown; release: () => void } | null = null;
  private idleAsked = false;
  /** Plots out of view wait until released (`holdOffScreen`). */
  private offScreenHeld = false;

  /** Queues `job` for `owner`, replacing a job of the same owner not yet started. */
  schedule(owner: unknown, job: PlotDrawJob): void {
    this.waiting.set(owner, job);
    this.next();
  }

  /**
   * Drops the owner's waiting job (its plot is going away). A drawing of a plot taken off
   * the page may never finish (Plotly's promise for a purged element), so its turn ends.
   */
  cancel(owner: unknown): void {
    this.waiting.delete(owner);
    const current = this.current;
    if (current && current.owner === owner) current.release();
  }

  /**
   * Holds the plots out of view (true) while an answer that will replace their figures is on
   * its way, or lets them be drawn again (false). Plots in view are drawn either way.
   */
  holdOffScreen(held: boolean): void {
    if (this.offScreenHeld === held) return;
    this.offScreenHeld = held;
    if (!held) this.next();
  }

  private next(): void {
    if (this.drawing || this.waiting.size === 0) return;
    const shown = this.firstWaiting(true);
    if (shown) return this.run(shown.owner);
    // Only plots below the fold wait: draw the first of them when the browser is idle. A
    // plot in view that asks meanwhile does not wait for that.
    if (this.idleAsked || this.offScreenHeld) return;
    this.idleAsked = true;
    this.whenIdle(() => {
      this.idleAsked = false;
      if (this.drawing) return;
      const first =
        this.firstWaiting(true) ?? (this.offScreenHeld ? null : this.firstWaiting(false));
      if (first) this.run(first.owner);
    });
  }

  /** The first waiting owner (in view only, or any), in the page's order. */
  private firstWaiting(inViewOnly: boolean): { owner: unknown } | null {
    for (const [owner, job] of this.waiting) {
      if (!inViewOnly || this.inView(job.element)) return { owner };
    }
    return null;
  }

  private run(owner: unknown): void {
    const job = this.waiting.get(owner)!;
    this.waiting.delete(owner);
    this.drawing = true;
    let released = false;
    const release = () => {
      if (released) return;
      released = true;
      if (this.current?.owner === owner) this.current = null;
      this.afterPaint(() => {
        this.drawing = false;
        this.next();
      });
    };
    this.current = { owner, release };
    // A drawing that never ends must not hold up the plots after it.
    this.view?.setTimeout(release, DRAW_WAIT_MS);
    // The plot reports its own failure; the queue goes on with the others.
    let drawing: Promise<unknown>;
    try {
      drawing = job.draw();
    } catch (error) {
      drawing = Promise.reject(error);
    }
    drawing.then(release, release);
  }

  /**
   * Whether any of the element is inside the window or within `NEAR_VIEW_PX` below it (an
   * unlaid element counts as out).
   */
  private inView(element: HTMLElement): boolean {
    const height = this.view?.innerHeight ?? 0;
    const box = element.getBoundingClientRect();
    return box.bottom > 0 && box.top < height + NEAR_VIEW_PX && box.height > 0;
  }

  /** Calls back once the browser has painted a frame (after the next animation frame). */
  private afterPaint(callback: () => void): void {
    const view = this.view;
    if (!view) return callback();
    if (typeof view.requestAnimationFrame === 'function') {
      view.requestAnimationFrame(() => view.setTimeout(callback, 0));
    } else {
      view.setTimeout(callback, 0);
    }
  }

  private whenIdle(callback: () => void): void {
    const view = this.view;
    if (!view) return callback();
    if (typeof view.requestIdleCallback === 'function') {
      view.requestIdleCallback(callback, { timeout: OFF_SCREEN_WAIT_MS });
    } else {
      view.setTimeout(callback, 0);
    }
  }
}
