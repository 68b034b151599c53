/**
 * Getting plots on screen quickly: the plotting library is fetched and evaluated while the
 * browser is idle after the results first show, so opening the Plots tab only draws (the
 * browser test times the click on the tab to the first plot painted, for the bench).
 */
import type { PlotlyApi } from './plotly-loader';

/** Mark set when the plotting library fetched ahead is ready. */
export const PLOTTING_READY_MARK = 'cw-plotting-ready';

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
