/** The CLI's sweep-table number formatter writes exactly what the engine's formatter writes. */
import { fastFormatNumber } from '../../scripts/cli/fast-number';
import { formatNumber } from '../../shared/engine';

/** A small deterministic generator (a linear congruential one), so a failure repeats. */
function values(count: number, seed = 12345): number[] {
  let x = seed;
  const next = () => (x = (x * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
  return Array.from({ length: count }, () => (next() - 0.5) * 10 ** (24 * next() - 12));
}

describe('fastFormatNumber', () => {
  it.each([6, 9])(
    'should give formatNumber’s text for %i digits over a wide spread of values',
    (digits) => {
      const spread = values(200_000);
      const differ = spread.filter((v) => fastFormatNumber(v, digits) !== formatNumber(v, digits));
      expect(differ).toEqual([]);
    },
  );

  it('should round exact halves as toPrecision does (away from zero), and keep the special values', () => {
    // 12,345,678.5 and 0.1234565 style ties, and values just either side of a power of ten.
    const cases = [12345678.5, -12345678.5, 1234567.25, 2.5, -2.5, 999999999.5, 99999.95, 1e21, 1e-300,
      9.9999999999, 0.00099999999999, 1000, -1000, 0, -0, Infinity, -Infinity, NaN]; // prettier-ignore
    for (const digits of [6, 9]) {
      for (const v of cases) expect([v, fastFormatNumber(v, digits)]).toEqual([v, formatNumber(v, digits)]); // prettier-ignore
    }
  });

  it('should give formatNumber’s text on a logarithmic frequency grid', () => {
    const grid = Array.from({ length: 100_000 }, (_, i) => 1e6 * 30 ** (i / 99_999));
    expect(grid.filter((f) => fastFormatNumber(f, 9) !== formatNumber(f, 9))).toEqual([]);
  });
});
