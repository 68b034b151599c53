/**
 * Round-trip properties of the design helpers (fast-check): every synthesised network,
 * built as a stage and terminated in R2, presents R1 at f0; snapping picks the nearest
 * member in log ratio.
 */
import fc from 'fast-check';
import { seriesValues, snapToSeries, type PreferredSeries } from '../../shared/engine/design';
import { findStageDefinition } from '../../shared/engine/stages';
import { build, c, rel, stageAbcd, zIn } from './stages-support';

const resistance = fc.double({ min: 1, max: 1e5, noNaN: true });
const frequency = fc.double({ min: 3, max: 9.3, noNaN: true }).map((e) => 10 ** e);
const lossless = { ql: 1e12, qc: 1e12 };

function presents(type: string, values: Record<string, number | string>, f0: number): number {
  const def = findStageDefinition(type);
  if (!def) throw new Error(type);
  const m = build(def, { mode: 'design', f0, ...lossless, ...values }, f0);
  const z = zIn(stageAbcd(m, f0), c(values.r2 as number));
  expect(Math.abs(z.im)).toBeLessThan(1e-6 * (values.r1 as number));
  return z.re;
}

describe('designed networks present R1 (property)', () => {
  it('L-sections, all four orientations', () => {
    fc.assert(
      fc.property(resistance, resistance, frequency, fc.boolean(), (r1, r2, f0, highpass) => {
        fc.pre(Math.abs(r1 / r2 - 1) > 1e-3);
        const orientation =
          r1 < r2
            ? highpass
              ? 'series-c-shunt-l'
              : 'series-l-shunt-c'
            : highpass
              ? 'shunt-l-series-c'
              : 'shunt-c-series-l';
        expect(rel(presents('l-match', { orientation, r1, r2 }, f0), r1)).toBeLessThan(1e-8);
      }),
      { numRuns: 200, seed: 7 },
    );
  });

  it('pi and T at any Q above the minimum, double L both ways', () => {
    fc.assert(
      fc.property(
        resistance,
        resistance,
        frequency,
        fc.double({ min: 1.01, max: 20, noNaN: true }),
        (r1, r2, f0, scale) => {
          fc.pre(Math.abs(r1 / r2 - 1) > 1e-3);
          const q = scale * Math.sqrt(Math.max(r1, r2) / Math.min(r1, r2) - 1);
          // Q = 1e12 parts still lose a little, and a network Q of up to 5000 magnifies it.
          expect(rel(presents('pi-match', { r1, r2, q }, f0), r1)).toBeLessThan(1e-7);
          expect(rel(presents('t-match', { r1, r2, q }, f0), r1)).toBeLessThan(1e-7);
          const form = r1 < r2 ? 'step-up' : 'step-down';
          expect(rel(presents('double-l-match', { form, r1, r2 }, f0), r1)).toBeLessThan(1e-8);
        },
      ),
      { numRuns: 200, seed: 11 },
    );
  });

  it('tapped-capacitor transformer, exact at any Q above the minimum', () => {
    fc.assert(
      fc.property(
        resistance,
        resistance,
        frequency,
        fc.double({ min: 1.01, max: 20, noNaN: true }),
        (a, b, f0, scale) => {
          fc.pre(Math.abs(a / b - 1) > 1e-3);
          const r1 = Math.max(a, b);
          const r2 = Math.min(a, b);
          const q = (scale * Math.sqrt(r1 / r2 - 1)) / 2;
          expect(rel(presents('tapped-c-match', { r1, r2, q }, f0), r1)).toBeLessThan(1e-8);
        },
      ),
      { numRuns: 200, seed: 13 },
    );
  });
});

describe('snapToSeries (property)', () => {
  it('returns a member with no member nearer in log ratio', () => {
    const members: Record<PreferredSeries, number[]> = {
      E6: seriesValues('E6', -13, 7),
      E12: seriesValues('E12', -13, 7),
      E24: seriesValues('E24', -13, 7),
      E48: seriesValues('E48', -13, 7),
      E96: seriesValues('E96', -13, 7),
    };
    fc.assert(
      fc.property(
        fc.double({ min: -12, max: 6.9, noNaN: true }).map((e) => 10 ** e),
        fc.constantFrom<PreferredSeries>('E6', 'E12', 'E24', 'E48', 'E96'),
        (v, series) => {
          const s = snapToSeries(v, series);
          const list = members[series];
          expect(list.some((m) => rel(m, s) < 1e-12)).toBe(true);
          const best = Math.min(...list.map((m) => Math.abs(Math.log(v / m))));
          expect(Math.abs(Math.log(v / s))).toBeLessThanOrEqual(best + 1e-12);
        },
      ),
      { numRuns: 500, seed: 17 },
    );
  });
});
