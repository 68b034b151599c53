/**
 * Preferred values (IEC 60063) and Wheeler's coil formula.
 */
import {
  SERIES_MANTISSAS,
  seriesValues,
  snapComponentValues,
  snapToSeries,
  wheelerInductance,
  wheelerTurns,
} from '../../shared/engine/design';

describe('IEC 60063 series', () => {
  it('ES-1: E12 and E24 decades as published (qsl.net/g4usp reproduction of IEC 60063)', () => {
    expect(SERIES_MANTISSAS.E12.map((m) => Math.round(m * 10))).toEqual([
      10, 12, 15, 18, 22, 27, 33, 39, 47, 56, 68, 82,
    ]);
    expect(SERIES_MANTISSAS.E24.map((m) => Math.round(m * 10))).toEqual([
      10, 11, 12, 13, 15, 16, 18, 20, 22, 24, 27, 30, 33, 36, 39, 43, 47, 51, 56, 62, 68, 75, 82,
      91,
    ]);
    // IEC uses 4.3 although 10^(15/24) = 4.217 would round to 4.2 (ES-1 "sources disagree").
    expect(SERIES_MANTISSAS.E24).toContain(4.3);
    expect(SERIES_MANTISSAS.E24).not.toContain(4.2);
  });

  it('E96: 96 values, each 10^(i/96) to three figures (IEC 60063 E96; from memory), spot values', () => {
    const e96 = SERIES_MANTISSAS.E96;
    expect(e96).toHaveLength(96);
    e96.forEach((m, i) => expect(m).toBeCloseTo(Number((10 ** (i / 96)).toPrecision(3)), 10));
    for (const v of [1.0, 1.69, 2.49, 3.32, 4.99, 6.04, 8.06, 9.76]) expect(e96).toContain(v);
  });

  it('E6 is every other E12 value', () => {
    expect(SERIES_MANTISSAS.E6).toEqual(SERIES_MANTISSAS.E12.filter((_, i) => i % 2 === 0));
  });

  // ES-1 nearest-value table; rule: nearest in log ratio (stated in preferred-values.ts).
  const table: [number, number, number][] = [
    [17, 18, 18],
    [316.7e-12, 330e-12, 330e-12],
    [2.387e-9, 2.2e-9, 2.4e-9],
    [9.549e-12, 10e-12, 10e-12],
    [4.4, 4.7, 4.3],
    [250, 270, 240],
  ];
  it.each(table)(
    'ES-1: %p snaps to %p in E12 and %p in E24 (nearest in log ratio)',
    (v, e12, e24) => {
      expect(snapToSeries(v, 'E12')).toBeCloseTo(e12, 20);
      expect(snapToSeries(v, 'E24')).toBeCloseTo(e24, 20);
      expect(snapToSeries(v, 'E12') / e12).toBeCloseTo(1, 12);
      expect(snapToSeries(v, 'E24') / e24).toBeCloseTo(1, 12);
    },
  );

  it('edges: exact members stay, decade boundaries, refusal of non-positive values', () => {
    expect(snapToSeries(4.7e3, 'E6')).toBe(4700);
    expect(snapToSeries(1, 'E24')).toBe(1);
    expect(snapToSeries(9.9, 'E12')).toBe(10);
    expect(snapToSeries(0.0999, 'E12')).toBe(0.1);
    expect(snapToSeries(1e-12, 'E96')).toBe(1e-12);
    expect(() => snapToSeries(0, 'E12')).toThrow(/positive/);
    expect(() => snapToSeries(-5, 'E12')).toThrow(RangeError);
    expect(seriesValues('E6', 0, 1)).toEqual([1, 1.5, 2.2, 3.3, 4.7, 6.8, 10, 15, 22, 33, 47, 68]);
  });
});

describe('snapComponentValues', () => {
  it('snaps the listed parts of a design and says how far each moved (LN-1 parts, E12)', () => {
    const { values, changePercent } = snapComponentValues(
      { l: 41.92e-6, c: 558.9e-12, r1: 75 },
      ['l', 'c'],
      'E12',
    );
    expect(values).toEqual({ l: 39e-6, c: 560e-12, r1: 75 });
    expect(changePercent.l).toBeCloseTo(((39 - 41.92) / 41.92) * 100, 9);
    expect(changePercent.c).toBeCloseTo(((560 - 558.9) / 558.9) * 100, 9);
    expect(() => snapComponentValues({}, ['l'], 'E6')).toThrow(/no value "l"/);
  });
});

describe("Wheeler's single-layer coil", () => {
  it('1 in diameter, 1 in long, 10 turns: 100/58 µH (formula L = d²n²/(18d + 40l), Wheeler 1928)', () => {
    expect(wheelerInductance(10, 0.0254, 0.0254)).toBeCloseTo((100 / 58) * 1e-6, 15);
  });

  it('turns for a wanted inductance round-trip', () => {
    const n = wheelerTurns(10e-6, 0.02, 0.03);
    expect(wheelerInductance(n, 0.02, 0.03)).toBeCloseTo(10e-6, 15);
    // Inductance grows as n²: twice the turns, four times the inductance.
    expect(wheelerInductance(2 * n, 0.02, 0.03) / 10e-6).toBeCloseTo(4, 12);
  });

  it('refuses a coil without size', () => {
    expect(() => wheelerTurns(1e-6, 0, 0.01)).toThrow(/above 0 m/);
    expect(() => wheelerTurns(0, 0.01, 0.01)).toThrow(/inductance/);
  });
});
