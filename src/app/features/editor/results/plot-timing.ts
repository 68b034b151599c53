/**
 * Getting plots on screen quickly: the plotting library is fetched and evaluated while the
 * browser is idle after the results first show, so opening the Plots tab only draws; and
 * the time from opening the tab to the first drawn plot is measured on the page's
 * timeline (the browser test reads it for the bench).
 */
import type { PlotlyApi } from './plotly-loader';

/** Mark set when the Plots tab opens. */
export const PLOTS_OPEN_MARK = 'cw-plots-open';
/** Mark set when the plotting library fetched ahead is ready. */
export const PLOTTING_READY_MARK = 'cw-plotting-ready';
/** Measure from the Plots tab opening to its first plot drawn. */
export const FIRST_PLOT_MEASURE = 'cw-first-plot';

interface IdleWindow {
  requestIdleCallback?: (callback: () => void, options?: { timeout: number }) => number;
  setTimeout: (callback: () => void, ms: number) => unknown;
}

/**
 * Loads the plotting library when the browser is next idle (within two seconds at the
 * latest). A failure is left for the plot itself to report when it is opened.
 */
export function prefetchWhenIdle(load: () => Promise<PlotlyApi>, view: IdleWindow | null): void {
  if (!view) return;
  const start = () =>
    void load().then(
      () => performance?.mark?.(PLOTTING_READY_MARK),
      () => undefined,
    );
  if (typeof view.requestIdleCallback === 'function') {
    view.requestIdleCallback(start, { timeout: 2000 });
  } else {
    view.setTimeout(start, 200);
  }
}

/** Marks the Plots tab opening (the start of the first-plot measure). */
export function markPlotsOpened(): void {
  if (typeof performance?.mark !== 'function') return;
  performance.clearMarks?.(PLOTS_OPEN_MARK);
  performance.mark(PLOTS_OPEN_MARK);
}

/** Ends the first-plot measure at the first plot drawn since the tab opened. */
export function measureFirstPlot(): void {
  if (typeof performance?.measure !== 'function' || !performance.getEntriesByName) return;
  if (performance.getEntriesByName(PLOTS_OPEN_MARK, 'mark').length === 0) return;
  performance.measure(FIRST_PLOT_MEASURE, PLOTS_OPEN_MARK);
  performance.clearMarks?.(PLOTS_OPEN_MARK);
}
