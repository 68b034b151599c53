/**
 * A recording stand-in for Plotly in component specs: jsdom cannot lay out SVG plots,
 * and the specs check what the panel asks Plotly to do, not Plotly's drawing.
 */
import type { Data, Layout } from 'plotly.js-dist-min';
import type { PlotlyApi } from '../plotly-loader';

export interface PlotlyCall {
  element: HTMLElement;
  data: Data[];
  layout: Partial<Layout>;
}

export interface FakePlotly {
  api: PlotlyApi;
  reacts: PlotlyCall[];
  relayouts: Record<string, unknown>[];
  purged: HTMLElement[];
  downloads: { root: unknown; filename: string; format: string }[];
  /** How many times the library was asked for. */
  loads: number;
  loader: () => Promise<PlotlyApi>;
}

export function fakePlotly(): FakePlotly {
  const fake: FakePlotly = {
    reacts: [],
    relayouts: [],
    purged: [],
    downloads: [],
    loads: 0,
    api: {
      react: (async (element: HTMLElement, data: Data[], layout: Partial<Layout>) => {
        fake.reacts.push({ element, data, layout });
        return element;
      }) as unknown as PlotlyApi['react'],
      relayout: (async (element: HTMLElement, update: Record<string, unknown>) => {
        fake.relayouts.push(update);
        return element;
      }) as unknown as PlotlyApi['relayout'],
      purge: ((element: HTMLElement) => {
        fake.purged.push(element);
      }) as unknown as PlotlyApi['purge'],
      downloadImage: (async (root: unknown, opts: { filename: string; format: string }) => {
        fake.downloads.push({ root, filename: opts.filename, format: opts.format });
        return '';
      }) as unknown as PlotlyApi['downloadImage'],
      Plots: { resize: () => undefined } as unknown as PlotlyApi['Plots'],
    },
    loader: () => {
      fake.loads += 1;
      return Promise.resolve(fake.api);
    },
  };
  return fake;
}
