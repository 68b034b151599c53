/**
 * Overlaid plots of several variants: one trace per variant, in the variant's colour.
 * Pure, built on the results panel's layout and marker helpers; SVG `scatter` only.
 */
import type { Data } from 'plotly.js-dist-min';
import type { AnalysisResult } from '../../../../shared/engine/types';
import type { PlotPalette } from '../editor/results/plot-theme';
import { decibels } from '../editor/results/format-quantity';
import {
  axisStyle,
  baseLayout,
  escapeMarkup,
  frequencyMarkers,
  imageFrequency,
  seriesColour,
  type PlotContext,
  type PlotFigure,
} from '../editor/results/plot-traces';

export interface OverlayVariant {
  name: string;
  result: AnalysisResult | null;
}

export interface OverlayOptions {
  palette: PlotPalette;
  scale: 'lin' | 'log';
}

/** Variants that have a sweep, with their colour index kept from the full list. */
function swept(variants: OverlayVariant[]) {
  return variants.flatMap((v, i) =>
    v.result?.sweep ? [{ name: escapeMarkup(v.name), result: v.result, colour: i }] : [],
  );
}

/**
 * The plot context of the first swept variant: its sweep sets the frequency span, and
 * its f0 and image frequency are the markers. Null when no variant has a sweep.
 */
export function overlayContext(
  variants: OverlayVariant[],
  options: OverlayOptions,
): PlotContext | null {
  const first = swept(variants)[0];
  if (!first) return null;
  return {
    sweep: first.result.sweep!,
    scale: options.scale,
    f0Hz: first.result.f0Hz,
    imageHz: imageFrequency(first.result),
    palette: options.palette,
    nodeNames: new Map(),
  };
}

/** Voltage step-up at each variant's last node over frequency, overlaid. */
export function stepUpOverlay(
  variants: OverlayVariant[],
  options: OverlayOptions,
): PlotFigure | null {
  const ctx = overlayContext(variants, options);
  if (!ctx) return null;
  const data: Data[] = swept(variants).map(({ name, result, colour }) => {
    const sweep = result.sweep!;
    const last = result.nodes.length - 1;
    const node = sweep.nodes.find((n) => n.index === last) ?? sweep.nodes[sweep.nodes.length - 1];
    return {
      type: 'scatter',
      mode: 'lines',
      name,
      x: sweep.freqsHz,
      y: node?.stepUpDb ?? [],
      line: { color: seriesColour(options.palette, colour), width: 2 },
      customdata: (node?.stepUpDb ?? []).map((v) => decibels(v)),
      hovertemplate: `%{customdata}<extra>${name}</extra>`,
    };
  });
  const markers = frequencyMarkers(ctx);
  return {
    // Ticked in hertz with our prefixes, again after a zoom, as the editor's plots are.
    tickUnits: { xaxis: 'hertz' },
    data,
    layout: {
      ...baseLayout(ctx, 'Voltage step-up at the last node'),
      yaxis: {
        ...axisStyle(options.palette),
        type: 'linear',
        title: { text: 'Step-up re EMF (dB)' },
      },
      shapes: markers.shapes,
      annotations: markers.annotations,
    },
  };
}

/** Return loss at each variant's input over frequency, overlaid. */
export function returnLossOverlay(
  variants: OverlayVariant[],
  options: OverlayOptions,
): PlotFigure | null {
  const ctx = overlayContext(variants, options);
  if (!ctx) return null;
  const data: Data[] = swept(variants).map(({ name, result, colour }) => ({
    type: 'scatter',
    mode: 'lines',
    name,
    x: result.sweep!.freqsHz,
    y: result.sweep!.returnLossDb,
    line: { color: seriesColour(options.palette, colour), width: 2 },
    customdata: result.sweep!.returnLossDb.map((v) => decibels(v)),
    hovertemplate: `%{customdata}<extra>${name}</extra>`,
  }));
  const markers = frequencyMarkers(ctx);
  return {
    tickUnits: { xaxis: 'hertz' },
    data,
    layout: {
      ...baseLayout(ctx, 'Input return loss (higher is a better match)'),
      yaxis: {
        ...axisStyle(options.palette),
        type: 'linear',
        title: { text: 'Return loss (dB)' },
        rangemode: 'tozero',
      },
      shapes: markers.shapes,
      annotations: markers.annotations,
    },
  };
}
