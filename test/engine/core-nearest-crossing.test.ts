/**
 * The outward scan for the rising crossing nearest a target returns what a scan of the whole
 * grid returns (nearestRisingCrossing), ties and falling local frequencies included, and
 * evaluates only the points near the target when the crossing is near.
 */
import fc from 'fast-check';
import { nearestRisingCrossing } from '../../shared/engine/core/extract-resonance';
import { nearestRisingOutward } from '../../shared/engine/core/nearest-crossing';

function outward(f: number[], v: number[], target: number, local?: number[]) {
  let calls = 0;
  const k = nearestRisingOutward(
    f.length,
    (i) => f[i],
    (i, out) => {
      calls++;
      out[0] = v[i];
      out[1] = local ? local[i] : f[i];
    },
    target,
    new Float64Array(2),
  );
  return { k, calls };
}

describe('nearestRisingOutward', () => {
  it('agrees with the whole-grid scan on any grid, values and target (property)', () => {
    const value = fc.oneof(
      fc.double({ min: -5, max: 5, noNaN: true }),
      fc.constantFrom(0, NaN, Infinity, -Infinity),
    );
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.double({ min: 0.01, max: 2, noNaN: true }), value, fc.boolean()), {
          minLength: 2,
          maxLength: 60,
        }),
        fc.double({ min: 0.5, max: 200, noNaN: true }),
        (points, target) => {
          // Ascending frequencies from positive steps; local falling where asked.
          const f: number[] = [];
          let x = 1;
          for (const [step] of points) f.push((x += step));
          const v = points.map(([, y]) => y);
          const local = points.map(([, , falls], i) => (falls ? -f[i] : f[i]));
          return (
            outward(f, v, target).k === nearestRisingCrossing(f, v, target) &&
            outward(f, v, target, local).k === nearestRisingCrossing(f, v, target, local)
          );
        },
      ),
      { numRuns: 2000 },
    );
  });

  it('keeps a crossing between subnormal values inside its bracket, as the whole-grid scan does', () => {
    // Found by the property above: 0.5 × the smallest subnormal rounded so that the crossing
    // of the first bracket was placed at 2.01, outside [1.01, 1.51], and the outward scan
    // stopped before the bracket the whole-grid scan picked.
    // The grid as the property builds it (1.5100000000000002, ...: the last bits matter).
    const f: number[] = [];
    let x = 1;
    for (const step of [0.01, 0.5000000000000001, 0.01, 0.01, 0.01]) f.push((x += step));
    const v = [-5e-324, 0, -5e-324, 0, 0];
    const target = 1.747913041315271;
    expect(nearestRisingCrossing(f, v, target)).toBe(2);
    expect(outward(f, v, target).k).toBe(2);
  });

  it('picks the lower bracket when two crossings are equally near', () => {
    // Crossings interpolated at 2 and 8: equally far from 4 in log frequency.
    const f = [1, 2, 3, 7, 8, 9];
    const v = [-1, 0, 1, -1, 0, 1];
    expect(outward(f, v, 4).k).toBe(nearestRisingCrossing(f, v, 4));
    expect(outward(f, v, 4).k).toBe(0);
  });

  it('evaluates only the points around a crossing near the target', () => {
    const n = 4001;
    const f = Array.from({ length: n }, (_, i) => 1e6 * (1 + i / 1000));
    const v = f.map((x) => x - 2.3e6); // rises through zero at 2.3 MHz
    const { k, calls } = outward(f, v, 2.31e6);
    expect(k).toBe(nearestRisingCrossing(f, v, 2.31e6));
    expect(calls).toBeLessThan(40);
  });
});
