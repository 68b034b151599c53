/**
 * The report's plots as static SVG pictures: the editor's figures, drawn by Plotly's
 * `toImage` off screen in print colours (dark on white, whatever the page's theme) and a
 * system font (a picture cannot use the page's web font). Vector, so they stay sharp on
 * paper; SVG traces only, so no GPU is needed.
 */
import type { ChainDocument } from '../../../../shared/schema/chain';
import type { AnalysisResult } from '../../../../shared/engine/types';
import type { PlotlyApi } from '../editor/results/plotly-loader';
import { FALLBACK_PALETTE, type PlotPalette } from '../editor/results/plot-theme';
import {
  type PlotContext,
  type PlotFigure,
  defaultPlotNodes,
  imageFrequency,
  impedanceChartFigure,
  impedanceFigure,
  returnLossFigure,
  stepUpFigure,
} from '../editor/results/plot-traces';

/** Drawn size in CSS pixels: the printable width of A4 and Letter at 96 px per inch. */
export const REPORT_PLOT_SIZE = { width: 680, height: 340 };

const PRINT_FONT = 'Arial, Helvetica, "Liberation Sans", "DejaVu Sans", sans-serif';

export const PRINT_PALETTE: PlotPalette = {
  ...FALLBACK_PALETTE,
  background: '#ffffff',
  text: '#111111',
  fontFamily: PRINT_FONT,
};

export interface ReportPlotSpec {
  key: string;
  title: string;
  caption: string;
  figure: PlotFigure;
}

export interface ReportPlot {
  key: string;
  title: string;
  caption: string;
  /** A `data:image/svg+xml` URL. */
  src: string;
}

/** The figures the report shows, or none when the analysis has no sweep. */
export function reportPlotSpecs(result: AnalysisResult, doc: ChainDocument): ReportPlotSpec[] {
  const sweep = result.sweep;
  if (!sweep || sweep.freqsHz.length < 2) return [];
  const ctx: PlotContext = {
    sweep,
    scale: doc.settings.sweep.scale,
    f0Hz: result.f0Hz,
    imageHz: imageFrequency(result),
    palette: PRINT_PALETTE,
    nodeNames: new Map(result.nodes.map((n) => [n.index, `Node ${n.index} · ${n.after}`])),
  };
  return [
    {
      key: 'step-up',
      title: 'Voltage step-up versus frequency',
      caption: "Step-up is |V| relative to the source EMF; ◇ marks each node's −3 dB points.",
      figure: stepUpFigure(ctx, defaultPlotNodes(result)),
    },
    {
      key: 'input-impedance',
      title: 'Input impedance, magnitude and phase',
      caption: 'The impedance the source sees: |Z| on the left scale, phase on the right.',
      figure: impedanceFigure(ctx),
    },
    {
      key: 'return-loss',
      title: 'Return loss at the input',
      caption: "Against the conjugate of the source impedance; the dotted line is the chain's match target.", // prettier-ignore
      figure: returnLossFigure(ctx, doc.settings.thresholds.matchReturnLossDb),
    },
    {
      key: 'impedance-chart',
      title: 'Input impedance chart',
      caption: 'Normalised to the source resistance at f0; ○ marks f0.',
      figure: impedanceChartFigure(ctx, result.nodes[0]?.zSrc.re ?? 50),
    },
  ];
}

type ToImage = (
  figure: { data: PlotFigure['data']; layout: PlotFigure['layout'] },
  options: { format: 'svg'; width: number; height: number },
) => Promise<string>;

/** Draws each figure to an SVG picture; a figure that fails is left out, not fatal. */
export async function drawReportPlots(
  plotly: PlotlyApi,
  specs: ReportPlotSpec[],
): Promise<ReportPlot[]> {
  const toImage = (plotly as unknown as { toImage: ToImage }).toImage;
  const plots: ReportPlot[] = [];
  for (const spec of specs) {
    const layout = {
      ...spec.figure.layout,
      ...REPORT_PLOT_SIZE,
      // The title is the report's own caption; the picture keeps only the axes.
      title: undefined,
      margin: { ...spec.figure.layout.margin, t: 24 },
      font: { ...spec.figure.layout.font, family: PRINT_FONT },
    };
    const src = await toImage(
      { data: spec.figure.data, layout },
      { format: 'svg', ...REPORT_PLOT_SIZE },
    );
    plots.push({ key: spec.key, title: spec.title, caption: spec.caption, src });
  }
  return plots;
}
