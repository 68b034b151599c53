/**
 * The CLI's sweep-table cells, written as bytes, are exactly what `toFixed(3)` and the
 * engine's formatter (`formatNumber`) give, aligned as `padStart`/`padEnd` align them.
 */
import { cellText, putFixed3, putSignificant } from '../../scripts/cli/number-bytes';
import { formatNumber } from '../../shared/engine';

/** A small deterministic generator (a linear congruential one), so a failure repeats. */
function values(count: number, seed = 12345): number[] {
  let x = seed;
  const next = () => (x = (x * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
  return Array.from({ length: count }, () => (next() - 0.5) * 10 ** (24 * next() - 12));
}

const significant = (v: number, digits: number, width = 14, left = false) =>
  cellText((buf, pos) => putSignificant(buf, pos, [v], 0, digits, width, left));
const fixed3 = (v: number, width = 14) =>
  cellText((buf, pos) => putFixed3(buf, pos, [v], 0, width, '—'));

// Ties of the exact decimal, values either side of powers of ten, and the special values.
const EDGES = [12345678.5, -12345678.5, 1234567.25, 2.5, -2.5, 999999999.5, 99999.95, 1e21,
  1e-300, 9.9999999999, 0.00099999999999, 1000, -1000, 0, -0, Infinity, -Infinity, NaN,
  1e-6, 9.99999e-7, 0.0005, -0.0005, 0.0015, 1.0005, 2.0005, -0.0001, 999.9996, 1e9, 1e15]; // prettier-ignore

describe('sweep-table cells as bytes', () => {
  it.each([6, 9])('should give formatNumber’s text for %i digits over a wide spread', (digits) => {
    const differ = values(200_000).filter(
      (v) => significant(v, digits) !== formatNumber(v, digits).padStart(14),
    );
    expect(differ).toEqual([]);
  });

  it('should give toFixed(3) for decibel values across their range', () => {
    const spread = values(200_000, 777).map((v) => v / 1e6);
    const differ = spread.filter((v) => fixed3(v) !== v.toFixed(3).padStart(14));
    expect(differ).toEqual([]);
  });

  it('should round exact halves and keep the special values as the methods do', () => {
    for (const v of EDGES) {
      for (const digits of [6, 9]) {
        expect([v, significant(v, digits)]).toEqual([v, formatNumber(v, digits).padStart(14)]);
      }
      const want = Number.isFinite(v) ? v.toFixed(3) : '—';
      expect([v, fixed3(v)]).toEqual([v, want.padStart(14)]);
    }
  });

  it('should align left when asked and let a long value overflow its column', () => {
    expect(significant(7e6, 9, 14, true)).toBe('7000000'.padEnd(14));
    expect(significant(-1.5e-7, 6, 14, true)).toBe('-1.5e-7'.padEnd(14));
    expect(fixed3(-123456789.0004, 6)).toBe('-123456789.000');
    expect(significant(123456.7, 6, 3)).toBe('123457');
  });

  it('should give formatNumber’s text on a logarithmic frequency grid', () => {
    const grid = Array.from({ length: 100_000 }, (_, i) => 1e6 * 30 ** (i / 99_999));
    expect(grid.filter((f) => significant(f, 9) !== formatNumber(f, 9).padStart(14))).toEqual([]);
  });
});
