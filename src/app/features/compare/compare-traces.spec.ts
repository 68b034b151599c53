import type { AnalysisResult } from '../../../../shared/engine/types';
import { FALLBACK_PALETTE } from '../editor/results/plot-theme';
import { SAMPLE_F0, SAMPLE_IMAGE, sampleResult } from '../editor/results/testing/sample-analysis';
import { returnLossOverlay, stepUpOverlay, type OverlayVariant } from './compare-traces';

const options = { palette: FALLBACK_PALETTE, scale: 'lin' as const };

function shifted(name: string, db: number): OverlayVariant {
  const result: AnalysisResult = sampleResult();
  const sweep = result.sweep!;
  sweep.nodes = sweep.nodes.map((n) => ({ ...n, stepUpDb: n.stepUpDb.map((v) => v + db) }));
  return { name, result };
}

describe('stepUpOverlay', () => {
  it('should draw one SVG trace per variant at its last node, each in its own colour', () => {
    const a = shifted('One tank', 0);
    const b = shifted('Coupled <pair>', 6);
    const figure = stepUpOverlay([a, b], options)!;
    expect(figure.data).toHaveLength(2);
    const last = a.result!.nodes.length - 1;
    const lastSeries = a.result!.sweep!.nodes.find((n) => n.index === last)!;
    const [ta, tb] = figure.data as {
      type: string;
      name: string;
      y: number[];
      line: { color: string };
    }[];
    expect(ta.type).toBe('scatter');
    expect(ta.y).toEqual(lastSeries.stepUpDb);
    expect(tb.y[0]).toBeCloseTo(lastSeries.stepUpDb[0] + 6);
    expect(ta.line.color).not.toBe(tb.line.color);
    // Names are the user's text, shown literally.
    expect(tb.name).toBe('Coupled &lt;pair&gt;');
  });

  it('should mark f0 and the image frequency', () => {
    const figure = stepUpOverlay([shifted('a', 0), shifted('b', 1)], options)!;
    const xs = (figure.layout.shapes ?? []).map((s) => s.x0);
    expect(xs).toContain(SAMPLE_F0);
    const texts = (figure.layout.annotations ?? []).map((a) => a.text);
    expect(texts.some((t) => t?.startsWith('f0'))).toBe(true);
    expect(texts.some((t) => t?.startsWith('image'))).toBe(
      SAMPLE_IMAGE <= sampleResult().sweep!.freqsHz.at(-1)!,
    );
  });

  it('should tick the frequency axis with our prefixes again after a zoom, as the editor does', () => {
    const variants = [shifted('a', 0), shifted('b', 1)];
    for (const figure of [
      stepUpOverlay(variants, options)!,
      returnLossOverlay(variants, options)!,
    ]) {
      // tickUnits is what the plot re-ticks on a zoom, and what its hover heading is written in.
      expect(figure.tickUnits).toEqual({ xaxis: 'hertz' });
      expect((figure.layout.xaxis as { ticktext?: string[] }).ticktext?.[0]).toMatch(/ [kM]?Hz$/);
    }
  });

  it('should keep a variant’s colour when an earlier one has no sweep', () => {
    const figure = stepUpOverlay([{ name: 'refused', result: null }, shifted('b', 0)], options)!;
    expect(figure.data).toHaveLength(1);
    expect((figure.data[0] as { line: { color: string } }).line.color).toBe(
      FALLBACK_PALETTE.series[1],
    );
  });

  it('should give no figure when no variant has a sweep', () => {
    expect(stepUpOverlay([{ name: 'x', result: null }], options)).toBeNull();
    expect(returnLossOverlay([], options)).toBeNull();
  });
});

describe('returnLossOverlay', () => {
  it('should overlay the input return loss of every variant', () => {
    const a = shifted('a', 0);
    const figure = returnLossOverlay([a, shifted('b', 0)], options)!;
    expect(figure.data).toHaveLength(2);
    expect((figure.data[0] as { y: number[] }).y).toEqual(a.result!.sweep!.returnLossDb);
    expect(figure.data.every((d) => d.type === 'scatter')).toBe(true);
  });
});
