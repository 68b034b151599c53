/**
 * The reflection chart of the input impedance: its own module, as it draws on a chart kind
 * unlike the sweep plots beside it.
 */
import type { PlotContext, PlotFigure } from './plot-traces';
import type { Data } from 'plotly.js-dist-min';
import { seriesColour } from './plot-traces';
import { engineering, figures, impedanceRect, nominalEngineering } from './format-quantity';

/** Index of the sweep point nearest `hz`. */
function nearestPoint(freqs: number[], hz: number): number {
  let best = 0;
  for (let i = 1; i < freqs.length; i++) {
    if (Math.abs(freqs[i] - hz) < Math.abs(freqs[best] - hz)) best = i;
  }
  return best;
}

/** A normalised impedance, e.g. "1.02 - j0.3", to the user's significant figures. */
function normalised(re: number, im: number): string {
  return `${figures(re)} ${im < 0 ? '-' : '+'} j${figures(Math.abs(im))}`;
}

/**
 * The input impedance over the sweep on a reflection chart (Plotly's SVG chart of
 * normalised impedance), normalised to `referenceOhm`, with the point nearest f0 marked.
 */
export function impedanceChartFigure(ctx: PlotContext, referenceOhm: number): PlotFigure {
  const { re, im } = ctx.sweep.zIn;
  const reference = referenceOhm > 0 && Number.isFinite(referenceOhm) ? referenceOhm : 50;
  const real = re.map((r) => r / reference);
  const imag = im.map((x) => x / reference);
  const f0 = nearestPoint(ctx.sweep.freqsHz, ctx.f0Hz);
  const axis = {
    color: ctx.palette.text,
    gridcolor: ctx.palette.grid,
    linecolor: ctx.palette.axis,
  };
  return {
    data: [
      {
        type: 'scattersmith',
        mode: 'lines',
        name: 'Z in / R ref',
        real,
        imag,
        // Frequency, normalised and actual impedance, written as the tables write them.
        customdata: ctx.sweep.freqsHz.map(
          (hz, i) =>
            `${engineering(hz, 'hertz')}<br>z = ${normalised(real[i], imag[i])}<br>Z = ${impedanceRect({ re: re[i], im: im[i] })}`,
        ),
        line: { color: seriesColour(ctx.palette, 0), width: 2 },
        hovertemplate: '%{customdata}<extra></extra>',
      } as Data,
      {
        type: 'scattersmith',
        mode: 'text+markers',
        name: 'f0',
        real: [real[f0]],
        imag: [imag[f0]],
        text: ['f0'],
        textposition: 'top right',
        textfont: { color: ctx.palette.marker },
        marker: { color: ctx.palette.marker, size: 9, symbol: 'circle-open', line: { width: 2 } },
        hovertemplate: `f0 ${nominalEngineering(ctx.f0Hz, 'hertz')}<extra></extra>`,
      } as Data,
    ],
    layout: {
      title: {
        text: `Input impedance chart (normalised to ${nominalEngineering(reference, 'ohm')})`,
        font: { size: 15 },
      },
      paper_bgcolor: ctx.palette.background,
      font: { color: ctx.palette.text, family: ctx.palette.fontFamily },
      margin: { l: 48, r: 48, t: 56, b: 40 },
      showlegend: false,
      smith: { bgcolor: ctx.palette.background, realaxis: axis, imaginaryaxis: axis },
      uirevision: 'keep',
    },
  };
}
