/**
 * Loads Plotly on first use through a dynamic import, so the ~4.8 MB library is a lazy
 * chunk fetched only when a plot is shown. Provided by token so specs can hand in a
 * recording double instead of the real library (jsdom cannot lay out SVG plots).
 */
import { InjectionToken } from '@angular/core';
import type PlotlyNamespace from 'plotly.js-dist-min';

/** The part of Plotly the results panel uses. */
export type PlotlyApi = Pick<
  typeof PlotlyNamespace,
  'react' | 'relayout' | 'purge' | 'downloadImage' | 'Plots'
>;

let pending: Promise<PlotlyApi> | null = null;

export function loadPlotly(): Promise<PlotlyApi> {
  pending ??= import('plotly.js-dist-min').then((module) => {
    // The package is CommonJS: the bundler puts module.exports on `default`.
    const withDefault = module as unknown as { default?: PlotlyApi };
    return withDefault.default ?? (module as unknown as PlotlyApi);
  });
  // A failed fetch (e.g. offline) should be retried on the next plot, not cached.
  pending.catch(() => (pending = null));
  return pending;
}

export const PLOTLY_LOADER = new InjectionToken<() => Promise<PlotlyApi>>('PLOTLY_LOADER', {
  providedIn: 'root',
  factory: () => loadPlotly,
});
