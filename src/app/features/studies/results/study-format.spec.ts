import { applySignificantFigures } from '../../../core/format/number-format';
import { histogramFigure, trackingFigure } from '../study-plots';
import { goalText, goalUnit, pct, withUnit } from './study-format';

describe('study figures', () => {
  afterEach(() => applySignificantFigures(4));

  it('should write values with their unit at the chosen significant figures', () => {
    expect(withUnit(2.3456e-10, 'farad')).toBe('234.6 pF');
    expect(withUnit(-12.3456, 'db')).toBe('-12.35 dB');
    expect(withUnit(41.23456, 'ratio')).toBe('41.23');
    expect(withUnit(null, 'hertz')).toBe('—');
    expect(pct(0.87654)).toBe('87.65 %');
    applySignificantFigures(6);
    expect(withUnit(2.3456e-10, 'farad')).toBe('234.560 pF');
    expect(pct(0.87654)).toBe('87.6540 %');
  });

  it('should word a goal with prefixed frequencies and give its unit', () => {
    const goal = { kind: 'resonance', stageId: 'tank', targetHz: 7.3e6, weight: 1 } as const;
    // A goal is the user's statement: rounded to the figures but not padded.
    expect(goalText(goal)).toBe('Resonance of tank at 7.3 MHz');
    expect(goalUnit(goal)).toBe('hertz');
    const rl = { kind: 'return-loss', startHz: 7e6, stopHz: 7.5e6, minDb: 15, weight: 1 } as const;
    expect(goalText(rl)).toBe('Return loss ≥ 15 dB, 7 MHz to 7.5 MHz');
    expect(goalUnit(rl)).toBe('db');
  });

  it('should tick a histogram and the tracking plot in hertz with prefixes', () => {
    const h = histogramFigure('Peak', 'hertz', { edges: [7.1e6, 7.2e6, 7.3e6], counts: [3, 5] });
    const x = h.layout.xaxis as { ticktext: string[] };
    expect(x.ticktext).toEqual(['7.1 MHz', '7.15 MHz', '7.2 MHz', '7.25 MHz', '7.3 MHz']);
    expect((h.data[0] as { customdata: string[] }).customdata[0]).toBe('7.100 MHz to 7.200 MHz');
    const t = trackingFigure({
      dialsHz: [6e6, 7e6, 8e6],
      circuits: [{ label: 'tank', errorsHz: [-1500, 0, 2500], resonancesHz: [6e6, 7e6, 8e6] }],
    });
    expect((t.layout.xaxis as { ticktext: string[] }).ticktext[0]).toBe('6 MHz');
    expect((t.layout.yaxis as { ticktext: string[] }).ticktext).toContain('0 Hz');
    expect((t.data[0] as { customdata: string[] }).customdata[0]).toBe('dial 6.000 MHz: off by -1.500 kHz'); // prettier-ignore
  });
});
