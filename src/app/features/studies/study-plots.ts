/**
 * Plot figures for study results (Plotly data and layout, no Angular). Axes are ticked and
 * hover text written as the tables write figures: prefixes, units, the user's figures.
 */
import type { UnitKind } from '../../../../shared/engine/types';
import { linearAxisTicks } from '../editor/results/plot-axes';
import type { PlotFigure } from '../editor/results/plot-traces';
import { withUnit } from './results/study-format';

export interface HistogramLike {
  edges: number[];
  counts: number[];
}

const AXIS = { automargin: true, zeroline: false };

/** An axis over `values` in `unit`, ticked with our prefixes (Plotly's own when none fit). */
function axis(title: string, values: (number | null)[], unit: UnitKind | undefined) {
  const ticks = unit === undefined ? null : linearAxisTicks(values, unit);
  return { ...AXIS, title: { text: title }, ...(ticks ?? {}) };
}

/** Trials per bin of one figure; `unit` is the figure's ('ratio' for a plain number). */
export function histogramFigure(title: string, unit: UnitKind, h: HistogramLike): PlotFigure {
  const centres = h.counts.map((_, i) => (h.edges[i] + h.edges[i + 1]) / 2);
  const width = h.edges.length > 1 ? h.edges[1] - h.edges[0] : 1;
  const bins = h.counts.map(
    (_, i) => `${withUnit(h.edges[i], unit)} to ${withUnit(h.edges[i + 1], unit)}`,
  );
  return {
    tickUnits: { xaxis: unit },
    data: [
      {
        type: 'bar',
        x: centres,
        y: h.counts,
        width,
        marker: { color: '#2f6f62' },
        name: title,
        customdata: bins,
        hovertemplate: '%{customdata}: %{y} trials<extra></extra>',
      },
    ],
    layout: {
      title: { text: title },
      xaxis: axis(title, h.edges, unit),
      yaxis: { ...AXIS, title: { text: 'trials' } },
      bargap: 0.02,
      margin: { t: 40, r: 16 },
    },
  };
}

/** One axis of the scatter: its label and unit. */
export interface ScatterAxis {
  label: string;
  unit?: UnitKind;
}

// SVG scatter, not WebGL: the app must draw on machines without a GPU.
export function scatterFigure(
  xAxis: ScatterAxis,
  yAxis: ScatterAxis,
  xs: (number | null)[],
  ys: (number | null)[],
  pass: (boolean | null)[],
): PlotFigure {
  const pick = (want: boolean | null) => {
    const x: number[] = [];
    const y: number[] = [];
    xs.forEach((v, i) => {
      const w = ys[i];
      if (v !== null && w !== null && pass[i] === want) {
        x.push(v);
        y.push(w);
      }
    });
    return { x, y };
  };
  const judged = pass.some((p) => p !== null);
  const sets = judged
    ? [
        { ...pick(true), name: 'meets the targets', color: '#2f6f62' },
        { ...pick(false), name: 'misses a target', color: '#b5462a' },
      ]
    : [{ ...pick(null), name: 'trials', color: '#2f6f62' }];
  return {
    tickUnits: { xaxis: xAxis.unit, yaxis: yAxis.unit },
    data: sets.map((s) => ({
      type: 'scatter',
      mode: 'markers',
      x: s.x,
      y: s.y,
      name: s.name,
      marker: { size: 4, color: s.color },
      customdata: s.x.map((x, i) => `${withUnit(x, xAxis.unit)}, ${withUnit(s.y[i], yAxis.unit)}`),
      hovertemplate: `%{customdata}<extra>${s.name}</extra>`,
    })),
    layout: {
      xaxis: axis(xAxis.label, xs, xAxis.unit),
      yaxis: axis(yAxis.label, ys, yAxis.unit),
      margin: { t: 24, r: 16 },
    },
  };
}

export interface BandPlotInput {
  dialsHz: number[];
  circuits: { label: string; errorsHz: (number | null)[]; resonancesHz: (number | null)[] }[];
}

/** Tracking error and resonance of each ganged circuit against the dial, all in hertz. */
export function trackingFigure(band: BandPlotInput): PlotFigure {
  const x = band.dialsHz;
  const hz = (v: number | null) => withUnit(v, 'hertz');
  const errors = band.circuits.flatMap((c) => c.errorsHz);
  const resonances = band.circuits.flatMap((c) => c.resonancesHz);
  return {
    tickUnits: { xaxis: 'hertz', yaxis: 'hertz' },
    data: band.circuits.flatMap((c) => [
      {
        type: 'scatter',
        mode: 'lines+markers',
        x,
        y: c.errorsHz,
        name: `${c.label}: tracking error`,
        customdata: c.errorsHz.map((e, i) => `dial ${hz(x[i])}: off by ${hz(e)}`),
        hovertemplate: '%{customdata}<extra></extra>',
      },
      {
        type: 'scatter',
        mode: 'lines',
        x,
        y: c.resonancesHz,
        name: `${c.label}: resonance`,
        yaxis: 'y2',
        line: { dash: 'dot' },
        customdata: c.resonancesHz.map((r, i) => `dial ${hz(x[i])}: resonates at ${hz(r)}`),
        hovertemplate: '%{customdata}<extra></extra>',
      },
    ]),
    layout: {
      xaxis: axis('dial frequency', x, 'hertz'),
      yaxis: { ...axis('tracking error', errors, 'hertz'), zeroline: true },
      yaxis2: { ...axis('resonance', resonances, 'hertz'), overlaying: 'y', side: 'right' },
      legend: { orientation: 'h', y: -0.25 },
      margin: { t: 24, r: 60 },
    },
  };
}
