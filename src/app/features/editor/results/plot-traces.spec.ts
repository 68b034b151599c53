import type { ScatterData, ScattersmithData, Shape } from 'plotly.js-dist-min';
import {
  type PlotContext,
  defaultPlotNodes,
  halfPowerEdges,
  imageFrequency,
  impedanceChartFigure,
  impedanceFigure,
  returnLossFigure,
  stepUpFigure,
} from './plot-traces';
import { FALLBACK_PALETTE } from './plot-theme';
import { SAMPLE_F0, SAMPLE_IMAGE, sampleResult } from './testing/sample-analysis';

describe('plot-traces', () => {
  describe('halfPowerEdges', () => {
    it('should give null for too few points or mismatched arrays', () => {
      expect(halfPowerEdges([1, 2], [0, 0])).toBeNull();
      expect(halfPowerEdges([1, 2, 3], [0, 0])).toBeNull();
    });

    it('should give null when the response does not fall 3 dB on both sides', () => {
      expect(halfPowerEdges([1, 2, 3, 4], [-10, 0, -1, -2])).toBeNull();
    });

    it('should interpolate the edges linearly in dB', () => {
      // Peak 0 dB at 3; −6 dB at 1 and 5 → the −3 dB points are halfway, at 2 and 4.
      const edges = halfPowerEdges([1, 3, 5], [-6, 0, -6]);
      expect(edges).toEqual({ lowHz: 2, highHz: 4, levelDb: -3 });
    });

    it('should match the bandwidth f0/Q of a single-tuned response', () => {
      const freqs = Array.from({ length: 2001 }, (_, i) => 9e6 + i * 1e3);
      const q = 25;
      const db = freqs.map((f) => -10 * Math.log10(1 + ((2 * q * (f - 10e6)) / 10e6) ** 2));
      const edges = halfPowerEdges(freqs, db);
      // Exactly 3 dB down (not 10·log10 2 = 3.01 dB): width = (f0/Q)·sqrt(10^0.3 − 1).
      const expected = (10e6 / q) * Math.sqrt(10 ** 0.3 - 1);
      expect(edges).not.toBeNull();
      expect((edges?.highHz ?? 0) - (edges?.lowHz ?? 0)).toBeCloseTo(expected, -1);
    });
  });

  describe('choices from the result', () => {
    it('should find the image frequency of a chain with a mixer', () => {
      expect(imageFrequency(sampleResult())).toBe(SAMPLE_IMAGE);
    });

    it('should have no image frequency without a mixer', () => {
      const noMixer = sampleResult();
      noMixer.selectivity.forEach((s) => (s.imageHz = null));
      expect(imageFrequency(noMixer)).toBeNull();
    });

    it('should plot the tank nodes and the last node by default', () => {
      expect(defaultPlotNodes(sampleResult())).toEqual([1, 4]);
    });
  });

  describe('axes', () => {
    it('should state the type of every axis, so Plotly does not read the data to guess it', () => {
      const ctx = context();
      for (const scale of ['lin', 'log'] as const) {
        const figures = [
          stepUpFigure({ ...ctx, scale }, [1, 4]),
          impedanceFigure({ ...ctx, scale }),
          returnLossFigure({ ...ctx, scale }, 10),
        ];
        for (const figure of figures) {
          const axes = Object.entries(figure.layout).filter(([key]) => /^[xy]axis\d*$/.test(key));
          expect(axes.length).toBeGreaterThanOrEqual(2);
          for (const [key, axis] of axes) {
            expect([key, (axis as { type?: string }).type]).toEqual([
              key,
              expect.stringMatching(/^(linear|log)$/),
            ]);
          }
        }
      }
    });
  });

  describe('stepUpFigure', () => {
    const figure = stepUpFigure(context(), [1, 4]);
    const traces = figure.data as Partial<ScatterData>[];

    it('should draw one SVG line per chosen node, never WebGL', () => {
      const lines = traces.filter((t) => t.mode === 'lines');
      expect(lines.map((t) => t.name)).toEqual(['Node 1 · Preselector', 'Node 4 · IF filter']);
      expect(traces.every((t) => t.type === 'scatter')).toBe(true);
    });

    it('should mark the −3 dB edges of each node in its colour', () => {
      const markers = traces.filter((t) => t.mode === 'markers');
      expect(markers).toHaveLength(2);
      expect(markers[0].marker?.color).toBe(FALLBACK_PALETTE.series[0]);
      expect(markers[1].marker?.color).toBe(FALLBACK_PALETTE.series[1]);
      const y = markers[0].y as number[];
      expect(y[0]).toBeCloseTo(16.97 - 3, 6);
    });

    it('should mark f0 and the image frequency', () => {
      const shapes = figure.layout.shapes as Shape[];
      expect(shapes.map((s) => s.x0)).toEqual([SAMPLE_F0, SAMPLE_IMAGE]);
      expect(figure.layout.annotations?.map((a) => a.text)).toEqual([
        'f0 10 MHz', // stated: not padded
        'image 10.91 MHz', // worked out: at the figures
      ]);
    });

    it('should leave out a marker that falls outside the sweep', () => {
      const far = stepUpFigure({ ...context(), imageHz: 20e6 }, [1]);
      expect((far.layout.shapes as Shape[]).map((s) => s.x0)).toEqual([SAMPLE_F0]);
    });

    it('should place the marker labels in log10 units on a log axis', () => {
      const log = stepUpFigure({ ...context(), scale: 'log' }, [1]);
      expect((log.layout.shapes as Shape[])[0].x0).toBe(SAMPLE_F0);
      expect(log.layout.annotations?.[0].x).toBeCloseTo(7, 12);
    });

    it('should follow the sweep scale on the frequency axis', () => {
      expect(figure.layout.xaxis?.type).toBe('linear');
      expect(stepUpFigure({ ...context(), scale: 'log' }, [1]).layout.xaxis?.type).toBe('log');
    });

    it('should skip a node the sweep does not have', () => {
      const lines = (stepUpFigure(context(), [9]).data as Partial<ScatterData>[]).filter(
        (t) => t.mode === 'lines',
      );
      expect(lines).toHaveLength(0);
    });

    it('should show a label with markup in it literally', () => {
      const ctx = context();
      ctx.nodeNames.set(1, 'Node 1 · <b>tank</b>');
      const names = (stepUpFigure(ctx, [1]).data as Partial<ScatterData>[]).map((t) => t.name);
      expect(names[0]).toBe('Node 1 · &lt;b&gt;tank&lt;/b&gt;');
    });
  });

  describe('impedanceFigure', () => {
    const figure = impedanceFigure(context());
    const [magnitude, phase] = figure.data as Partial<ScatterData>[];

    it('should plot |Z| on a log axis and phase on a second axis', () => {
      expect(figure.layout.yaxis?.type).toBe('log');
      expect(phase.yaxis).toBe('y2');
      expect(figure.layout.yaxis2?.overlaying).toBe('y');
    });

    it('should compute magnitude and phase from R and X', () => {
      // At 10.4 MHz the sample has R = 48 Ω, X = 4 Ω.
      const i = 14;
      expect((magnitude.y as number[])[i]).toBeCloseTo(Math.hypot(48, 4), 9);
      expect((phase.y as number[])[i]).toBeCloseTo((Math.atan2(4, 48) * 180) / Math.PI, 9);
    });
  });

  describe('impedanceChartFigure', () => {
    it('should normalise the input impedance to the reference resistance', () => {
      const [path] = impedanceChartFigure(context(), 50).data as Partial<ScattersmithData>[];
      expect(path.type).toBe('scattersmith');
      expect((path.real as number[])[14]).toBeCloseTo(48 / 50, 12);
      expect((path.imag as number[])[14]).toBeCloseTo(4 / 50, 12);
    });

    it('should mark the sweep point nearest f0', () => {
      const [, marker] = impedanceChartFigure(context(), 50).data as Partial<ScattersmithData>[];
      // The sample has R = 48 Ω and X = 0 at 10 MHz.
      expect(marker.real).toEqual([48 / 50]);
      expect(marker.imag).toEqual([0]);
    });

    it('should fall back to 50 Ω for an unusable reference', () => {
      const figure = impedanceChartFigure(context(), 0);
      expect(figure.layout.title?.text).toContain('(normalised to 50 Ω)');
    });
  });

  describe('returnLossFigure', () => {
    it('should draw the chain match target as a guide line', () => {
      const figure = returnLossFigure(context(), 15);
      const shapes = figure.layout.shapes as Shape[];
      const guide = shapes.find((s) => s.yref === 'y');
      expect(guide).toMatchObject({ y0: 15, y1: 15 });
      expect(figure.layout.annotations?.some((a) => a.text === 'match target 15 dB')).toBe(true);
    });
  });
});

// Helpers

function context(): PlotContext {
  const result = sampleResult();
  if (!result.sweep) throw new Error('sample has a sweep');
  return {
    sweep: result.sweep,
    scale: 'lin',
    f0Hz: result.f0Hz,
    imageHz: imageFrequency(result),
    palette: FALLBACK_PALETTE,
    nodeNames: new Map(result.nodes.map((n) => [n.index, `Node ${n.index} · ${n.after}`])),
  };
}
