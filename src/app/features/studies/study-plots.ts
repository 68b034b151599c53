/** Plot figures for study results (Plotly data and layout, no Angular). */
import type { PlotFigure } from '../editor/results/plot-traces';

export interface HistogramLike {
  edges: number[];
  counts: number[];
}

const AXIS = { automargin: true, zeroline: false };

export function histogramFigure(title: string, unit: string, h: HistogramLike): PlotFigure {
  const centres = h.counts.map((_, i) => (h.edges[i] + h.edges[i + 1]) / 2);
  const width = h.edges.length > 1 ? h.edges[1] - h.edges[0] : 1;
  return {
    data: [
      { type: 'bar', x: centres, y: h.counts, width, marker: { color: '#2f6f62' }, name: title },
    ],
    layout: {
      title: { text: title },
      xaxis: { ...AXIS, title: { text: unit } },
      yaxis: { ...AXIS, title: { text: 'trials' } },
      bargap: 0.02,
      margin: { t: 40, r: 16 },
    },
  };
}

// SVG scatter, not WebGL: the app must draw on machines without a GPU.
export function scatterFigure(
  xLabel: string,
  yLabel: string,
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
    data: sets.map((s) => ({
      type: 'scatter',
      mode: 'markers',
      x: s.x,
      y: s.y,
      name: s.name,
      marker: { size: 4, color: s.color },
    })),
    layout: {
      xaxis: { ...AXIS, title: { text: xLabel } },
      yaxis: { ...AXIS, title: { text: yLabel } },
      margin: { t: 24, r: 16 },
    },
  };
}

export interface BandPlotInput {
  dialsHz: number[];
  circuits: { label: string; errorsHz: (number | null)[]; resonancesHz: (number | null)[] }[];
}

export function trackingFigure(band: BandPlotInput): PlotFigure {
  const mhz = (v: number | null) => (v === null ? null : v / 1e6);
  const x = band.dialsHz.map((v) => v / 1e6);
  return {
    data: band.circuits.flatMap((c) => [
      {
        type: 'scatter',
        mode: 'lines+markers',
        x,
        y: c.errorsHz.map((e) => (e === null ? null : e / 1e3)),
        name: `${c.label}: tracking error (kHz)`,
      },
      {
        type: 'scatter',
        mode: 'lines',
        x,
        y: c.resonancesHz.map(mhz),
        name: `${c.label}: resonance (MHz)`,
        yaxis: 'y2',
        line: { dash: 'dot' },
      },
    ]),
    layout: {
      xaxis: { ...AXIS, title: { text: 'dial frequency (MHz)' } },
      yaxis: { ...AXIS, title: { text: 'tracking error (kHz)' }, zeroline: true },
      yaxis2: { ...AXIS, title: { text: 'resonance (MHz)' }, overlaying: 'y', side: 'right' },
      legend: { orientation: 'h', y: -0.25 },
      margin: { t: 24, r: 60 },
    },
  };
}
