/**
 * Plot figures (traces and layout) built from an analysis result. Pure: no Plotly at run
 * time here, only its types, so these are cheap to test and keep Plotly out of the
 * initial bundle. Every trace is SVG `scatter` (never `scattergl`): no GPU needed. Every
 * axis states its type: left out, Plotly reads through the data to guess it on each drawing.
 */
import type { Annotation, Data, Layout, LayoutAxis, Shape } from 'plotly.js-dist-min';
import type { AnalysisResult, SweepReport } from '../../../../../shared/engine/types';
import { linearAxisTicks, logAxisTicks, type AxisUnits } from './plot-axes';
import {
  decibels,
  degrees,
  engineering,
  nominalDecibels,
  nominalEngineering,
} from './format-quantity';
import { significantFigures } from '../../../core/format/number-format';
import type { PlotPalette } from './plot-theme';

export interface PlotFigure {
  data: Data[];
  layout: Partial<Layout>;
  tickUnits?: AxisUnits; // axes with our tick labels, re-ticked on zoom and pan
}

export interface PlotContext {
  sweep: SweepReport;
  scale: 'lin' | 'log';
  f0Hz: number;
  /** Image frequency at the chain input when the chain has a mixer. */
  imageHz: number | null;
  palette: PlotPalette;
  /** Legend names per node, e.g. "Node 2 · LNA". */
  nodeNames: Map<number, string>;
}

export interface HalfPowerEdges {
  lowHz: number;
  highHz: number;
  /** The level the edges sit at: peak − 3 dB. */
  levelDb: number;
}

/**
 * The −3 dB points around the highest point of `db` over `freqs`, interpolated linearly
 * in dB between sweep points. Null when the response does not fall 3 dB on both sides
 * inside the sweep (an edge outside the sweep is not guessed at).
 */
export function halfPowerEdges(freqs: number[], db: number[]): HalfPowerEdges | null {
  if (freqs.length < 3 || freqs.length !== db.length) return null;
  let peak = 0;
  for (let i = 1; i < db.length; i++) if (db[i] > db[peak]) peak = i;
  const level = db[peak] - 3;
  const cross = (i: number, j: number) =>
    freqs[i] + ((level - db[i]) / (db[j] - db[i])) * (freqs[j] - freqs[i]);
  let low: number | null = null;
  for (let i = peak; i > 0; i--) {
    if (db[i - 1] <= level) {
      low = cross(i - 1, i);
      break;
    }
  }
  let high: number | null = null;
  for (let i = peak; i < db.length - 1; i++) {
    if (db[i + 1] <= level) {
      high = cross(i, i + 1);
      break;
    }
  }
  return low === null || high === null ? null : { lowHz: low, highHz: high, levelDb: level };
}

/** The image frequency a mixer in the chain responds to, from the selectivity report. */
export function imageFrequency(result: AnalysisResult): number | null {
  return result.selectivity.find((s) => s.imageHz !== null)?.imageHz ?? null;
}

/** Nodes drawn by default: the tank nodes and the last node, at most four. */
export function defaultPlotNodes(result: AnalysisResult): number[] {
  const last = result.nodes.length - 1;
  const tanks = result.resonators.flatMap((r) => (r.node === null ? [] : [r.node]));
  const chosen = [...new Set([...tanks, last])].filter((n) => n >= 0).sort((a, b) => a - b);
  return chosen.slice(-4);
}

function frequencyAxis(ctx: PlotContext): Partial<LayoutAxis> {
  const log = ctx.scale === 'log';
  // Ticks written as the tables write values ("100 kHz", "1 MHz"), on either scale.
  const ticks = log
    ? logAxisTicks(ctx.sweep.freqsHz, 'hertz')
    : linearAxisTicks(ctx.sweep.freqsHz, 'hertz');
  // The shared hover box's heading is drawn by Plotly in d3's SI form ("7.322MHz"); the
  // plot then writes it again as ours ("7.322 MHz", hover-heading.ts). The values under it
  // are ours from the start (customdata).
  const heading = `%{x:.${significantFigures()}~s}Hz`;
  return {
    ...axisStyle(ctx.palette),
    type: log ? 'log' : 'linear',
    title: { text: 'Frequency at the chain input' },
    ...(ticks ?? { ticksuffix: 'Hz', exponentformat: 'SI' }),
    hoverformat: `.${significantFigures()}~s`,
    unifiedhovertitle: { text: heading },
  } as Partial<LayoutAxis>;
}

export function axisStyle(palette: PlotPalette): Partial<LayoutAxis> {
  return {
    color: palette.text,
    gridcolor: palette.grid,
    linecolor: palette.axis,
    zerolinecolor: palette.axis,
    showline: true,
    automargin: true,
  };
}

export function baseLayout(ctx: PlotContext, title: string): Partial<Layout> {
  return {
    title: { text: title, font: { size: 15 } },
    paper_bgcolor: ctx.palette.background,
    plot_bgcolor: ctx.palette.background,
    font: { color: ctx.palette.text, family: ctx.palette.fontFamily },
    margin: { l: 64, r: 64, t: 48, b: 56 },
    hovermode: 'x unified',
    legend: { orientation: 'h', y: -0.25, font: { color: ctx.palette.text } },
    xaxis: frequencyAxis(ctx),
    // Keep zoom and hidden traces when a new result arrives for the same chain.
    uirevision: 'keep',
  };
}

/** Vertical markers at f0 and, for a chain with a mixer, at the image frequency. */
export function frequencyMarkers(ctx: PlotContext): { shapes: Shape[]; annotations: Annotation[] } {
  const first = ctx.sweep.freqsHz[0];
  const last = ctx.sweep.freqsHz[ctx.sweep.freqsHz.length - 1];
  const inSweep = (f: number) => f >= first && f <= last;
  // f0 is the user's (written as stated, "f0 7.2 MHz"); the image is worked out (a result).
  const markers: { hz: number; label: string; dash: string; text: string }[] = [
    { hz: ctx.f0Hz, label: 'f0', dash: 'dash', text: nominalEngineering(ctx.f0Hz, 'hertz') },
  ];
  if (ctx.imageHz !== null)
    markers.push({ hz: ctx.imageHz, label: 'image', dash: 'dot', text: engineering(ctx.imageHz, 'hertz') }); // prettier-ignore
  const shown = markers.filter((m) => inSweep(m.hz));
  return {
    shapes: shown.map(
      (m): Shape =>
        ({
          type: 'line',
          xref: 'x',
          yref: 'paper',
          x0: m.hz,
          x1: m.hz,
          y0: 0,
          y1: 1,
          line: { color: ctx.palette.marker, width: 1.5, dash: m.dash },
        }) as Shape,
    ),
    annotations: shown.map(
      (m): Annotation =>
        ({
          xref: 'x',
          yref: 'paper',
          // Unlike shapes, annotations on a log axis are placed in log10 units.
          x: ctx.scale === 'log' ? Math.log10(m.hz) : m.hz,
          y: 1,
          yanchor: 'bottom',
          text: `${m.label} ${m.text}`,
          showarrow: false,
          font: { color: ctx.palette.marker, size: 11 },
        }) as Annotation,
    ),
  };
}

/** Plotly renders names as pseudo-HTML in hover labels: show the user's label literally. */
export function escapeMarkup(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

export function seriesColour(palette: PlotPalette, i: number): string {
  return palette.series[i % palette.series.length];
}

/** Voltage step-up (dB re the source EMF) over the sweep at the chosen nodes, overlaid. */
export function stepUpFigure(ctx: PlotContext, nodes: number[]): PlotFigure {
  const data: Data[] = [];
  nodes.forEach((index, i) => {
    const series = ctx.sweep.nodes.find((n) => n.index === index);
    if (!series) return;
    const colour = seriesColour(ctx.palette, i);
    const name = escapeMarkup(ctx.nodeNames.get(index) ?? `Node ${index}`);
    data.push({
      type: 'scatter',
      mode: 'lines',
      name,
      legendgroup: name,
      x: ctx.sweep.freqsHz,
      y: series.stepUpDb,
      line: { color: colour, width: 2 },
      customdata: series.stepUpDb.map((v) => decibels(v)),
      hovertemplate: '%{customdata}<extra>' + name + '</extra>',
    });
    const edges = halfPowerEdges(ctx.sweep.freqsHz, series.stepUpDb);
    if (edges) {
      data.push({
        type: 'scatter',
        mode: 'markers',
        name: `${name} −3 dB`,
        legendgroup: name,
        showlegend: false,
        x: [edges.lowHz, edges.highHz],
        y: [edges.levelDb, edges.levelDb],
        marker: { color: colour, size: 9, symbol: 'diamond-open', line: { width: 2 } },
        customdata: [edges.lowHz, edges.highHz].map((hz) => engineering(hz, 'hertz')),
        hovertemplate: `−3 dB edge %{customdata}<extra>${name}</extra>`,
      });
    }
  });
  const markers = frequencyMarkers(ctx);
  return {
    tickUnits: { xaxis: 'hertz' },
    data,
    layout: {
      ...baseLayout(ctx, 'Voltage step-up at chosen nodes'),
      yaxis: {
        ...axisStyle(ctx.palette),
        type: 'linear',
        title: { text: 'Step-up re EMF (dB)' },
      },
      shapes: markers.shapes,
      annotations: markers.annotations,
    },
  };
}

/** Impedance looking into the chain from the source: magnitude (log) and phase. */
export function impedanceFigure(ctx: PlotContext): PlotFigure {
  const { re, im } = ctx.sweep.zIn;
  const magnitude = re.map((r, i) => Math.hypot(r, im[i]));
  const phase = re.map((r, i) => (Math.atan2(im[i], r) * 180) / Math.PI);
  const markers = frequencyMarkers(ctx);
  return {
    tickUnits: { xaxis: 'hertz', yaxis: 'ohm' },
    data: [
      {
        type: 'scatter',
        mode: 'lines',
        name: '|Z in|',
        x: ctx.sweep.freqsHz,
        y: magnitude,
        line: { color: seriesColour(ctx.palette, 0), width: 2 },
        customdata: magnitude.map((v) => engineering(v, 'ohm')),
        hovertemplate: '%{customdata}<extra>|Z in|</extra>',
      },
      {
        type: 'scatter',
        mode: 'lines',
        name: 'Phase',
        x: ctx.sweep.freqsHz,
        y: phase,
        yaxis: 'y2',
        line: { color: seriesColour(ctx.palette, 1), width: 2, dash: 'dash' },
        customdata: phase.map((v) => degrees(v)),
        hovertemplate: '%{customdata}<extra>Phase</extra>',
      },
    ],
    layout: {
      ...baseLayout(ctx, 'Input impedance (looking into the chain)'),
      yaxis: {
        ...axisStyle(ctx.palette),
        type: 'log',
        title: { text: '|Z| (Ω)' },
        exponentformat: 'SI',
        // "1 kΩ, 10 kΩ, 100 kΩ", as the tables write impedances.
        ...(logAxisTicks(magnitude, 'ohm') ?? {}),
      },
      yaxis2: {
        ...axisStyle(ctx.palette),
        type: 'linear',
        title: { text: 'Phase (°)' },
        overlaying: 'y',
        side: 'right',
        range: [-95, 95],
        dtick: 45,
        showgrid: false,
        // A phase zero line would read as a gridline of the |Z| scale.
        zeroline: false,
      },
      shapes: markers.shapes,
      annotations: markers.annotations,
    },
  };
}

/** Return loss at the chain input, with the chain's match threshold as a guide line. */
export function returnLossFigure(ctx: PlotContext, thresholdDb: number): PlotFigure {
  const markers = frequencyMarkers(ctx);
  const threshold = {
    type: 'line',
    xref: 'paper',
    yref: 'y',
    x0: 0,
    x1: 1,
    y0: thresholdDb,
    y1: thresholdDb,
    line: { color: ctx.palette.warn, width: 1.5, dash: 'dot' },
  } as Shape;
  const thresholdLabel = {
    xref: 'paper',
    yref: 'y',
    x: 1,
    xanchor: 'right',
    y: thresholdDb,
    yanchor: 'bottom',
    text: `match target ${nominalDecibels(thresholdDb)}`, // the user's target, as stated
    showarrow: false,
    font: { color: ctx.palette.warn, size: 11 },
  } as Annotation;
  return {
    tickUnits: { xaxis: 'hertz' },
    data: [
      {
        type: 'scatter',
        mode: 'lines',
        name: 'Return loss',
        x: ctx.sweep.freqsHz,
        y: ctx.sweep.returnLossDb,
        line: { color: seriesColour(ctx.palette, 2), width: 2 },
        customdata: ctx.sweep.returnLossDb.map((v) => decibels(v)),
        hovertemplate: '%{customdata}<extra>Return loss</extra>',
      },
    ],
    layout: {
      ...baseLayout(ctx, 'Return loss at the input (higher is a better match)'),
      yaxis: {
        ...axisStyle(ctx.palette),
        type: 'linear',
        title: { text: 'Return loss (dB)' },
        rangemode: 'tozero',
      },
      shapes: [...markers.shapes, threshold],
      annotations: [...markers.annotations, thresholdLabel],
      showlegend: false,
    },
  };
}

export { impedanceChartFigure } from './impedance-chart';
