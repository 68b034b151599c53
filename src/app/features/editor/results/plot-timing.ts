/**
 * Getting plots on screen quickly: the plotting library is fetched, evaluated and run once
 * on a hidden throwaway plot while the browser is idle after the results first show, so
 * opening the Plots tab only draws (the browser test times the click on the tab to the
 * first plot painted, for the bench).
 */
import type { PlotlyApi } from './plotly-loader';

/** Mark set when the plotting library fetched ahead is ready (and warmed, when asked). */
export const PLOTTING_READY_MARK = 'cw-plotting-ready';

interface IdleWindow {
  requestIdleCallback?: (callback: () => void, options?: { timeout: number }) => number;
  setTimeout: (callback: () => void, ms: number) => unknown;
}

/**
 * Loads the plotting library when the browser is next idle (within two seconds at the
 * latest), then, at the next idle moment, runs `warm` with it. A failure is left for the
 * plot itself to report when it is opened.
 */
export function prefetchWhenIdle(
  load: () => Promise<PlotlyApi>,
  view: IdleWindow | null,
  warm: (plotly: PlotlyApi) => Promise<unknown> = () => Promise.resolve(),
): void {
  if (!view) return;
  const whenIdle = (callback: () => void) => {
    if (typeof view.requestIdleCallback === 'function') {
      view.requestIdleCallback(callback, { timeout: 2000 });
    } else {
      view.setTimeout(callback, 200);
    }
  };
  const ready = () => performance?.mark?.(PLOTTING_READY_MARK);
  whenIdle(
    () =>
      void load().then(
        (plotly) => whenIdle(() => void warm(plotly).then(ready, ready)),
        () => undefined,
      ),
  );
}

/**
 * Draws a small plot with the features the result plots use (title, axis titles, legend,
 * a marker line and its label, the unified hover) into a hidden element and removes it.
 * The first drawing in a page pays for compiling and setting up the library; this way the
 * first plot the person opens does not.
 */
export function warmPlotly(plotly: PlotlyApi, page: Document): Promise<unknown> {
  const host = page.createElement('div');
  host.setAttribute('aria-hidden', 'true');
  host.style.cssText =
    'position:fixed;left:-10000px;top:0;width:480px;height:320px;visibility:hidden;pointer-events:none';
  page.body.appendChild(host);
  const x = [1e6, 2e6, 3e6, 4e6];
  return plotly
    .react(
      host,
      [
        {
          type: 'scatter',
          mode: 'lines',
          name: 'a',
          x,
          y: [1, 3, 2, 4],
          customdata: ['1', '3', '2', '4'],
        },
        { type: 'scatter', mode: 'markers', name: 'b', x: [2e6], y: [3], showlegend: false },
      ],
      {
        title: { text: 'warm-up' },
        height: 320,
        hovermode: 'x unified',
        legend: { orientation: 'h', y: -0.25 },
        xaxis: {
          type: 'linear',
          title: { text: 'f' },
          tickvals: x,
          ticktext: ['1', '2', '3', '4'],
          automargin: true,
        },
        yaxis: { type: 'linear', title: { text: 'y' }, automargin: true },
        shapes: [{ type: 'line', xref: 'x', yref: 'paper', x0: 2e6, x1: 2e6, y0: 0, y1: 1 }],
        annotations: [{ xref: 'x', yref: 'paper', x: 2e6, y: 1, text: 'f0', showarrow: false }],
      },
      { displaylogo: false, responsive: false },
    )
    .then(() => plotly.purge(host))
    .finally(() => host.remove());
}
