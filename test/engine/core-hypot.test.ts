/**
 * hypot2 against Math.hypot: the same double (Object.is: the sign of zero and NaN included)
 * on zeros, subnormals, the largest doubles, infinities, NaN and random values over the whole
 * exponent range, in both argument orders and with either sign.
 */
import fc from 'fast-check';
import { hypot2 } from '../../shared/engine/core/hypot';

const EDGES = [
  0,
  -0,
  Number.MIN_VALUE,
  2 * Number.MIN_VALUE,
  2.2250738585072009e-308, // largest subnormal
  2.2250738585072014e-308, // smallest normal
  1e-300,
  1e-200,
  1e-160,
  Number.EPSILON,
  0.5,
  1,
  1 + Number.EPSILON,
  3,
  4,
  1e8,
  1e154,
  1e160,
  1e200,
  1.3407807929942596e154, // √(largest double): its square is the largest double
  Number.MAX_VALUE / 2,
  Number.MAX_VALUE,
  Number.POSITIVE_INFINITY,
  Number.NEGATIVE_INFINITY,
  Number.NaN,
];

/** Every edge value with either sign. */
const SIGNED = EDGES.flatMap((v) => [v, -v]);

/** A double with a random mantissa and a random binary exponent over the whole range. */
function randomDouble(rand: () => number): number {
  const mantissa = 1 + rand();
  const exponent = Math.floor(rand() * 2100) - 1075;
  const sign = rand() < 0.5 ? -1 : 1;
  return sign * mantissa * 2 ** exponent;
}

/** A small deterministic generator (mulberry32), so a failure can be reproduced. */
function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

describe('hypot2', () => {
  it('equals Math.hypot on every pair of edge values, in both orders and signs', () => {
    const differ: string[] = [];
    for (const re of SIGNED) {
      for (const im of SIGNED) {
        const want = Math.hypot(re, im);
        const got = hypot2(re, im);
        if (!Object.is(got, want)) differ.push(`hypot(${re}, ${im}): ${got} ≠ ${want}`);
      }
    }
    expect(differ).toEqual([]);
  });

  it('names the special cases: +∞ beside NaN, NaN otherwise, +0 for two zeros', () => {
    expect(hypot2(Number.NaN, Number.NEGATIVE_INFINITY)).toBe(Number.POSITIVE_INFINITY);
    expect(hypot2(Number.POSITIVE_INFINITY, Number.NaN)).toBe(Number.POSITIVE_INFINITY);
    expect(hypot2(Number.NaN, 0)).toBeNaN();
    expect(hypot2(0, Number.NaN)).toBeNaN();
    expect(hypot2(-0, Number.NaN)).toBeNaN();
    expect(hypot2(2, Number.NaN)).toBeNaN();
    expect(Object.is(hypot2(-0, -0), 0)).toBe(true);
    expect(hypot2(3, -4)).toBe(5);
    // Scaled before squaring: neither overflows nor underflows to zero.
    expect(hypot2(1e300, 1e300)).toBe(Math.SQRT2 * 1e300);
    expect(hypot2(3 * Number.MIN_VALUE, 4 * Number.MIN_VALUE)).toBe(5 * Number.MIN_VALUE);
  });

  it('equals Math.hypot on a million random pairs over the whole exponent range', () => {
    // Enough calls that the engine optimises both functions: the optimised code is compared.
    const rand = mulberry32(20240611);
    let differ = 0;
    let first = '';
    for (let i = 0; i < 1_000_000; i++) {
      const re = randomDouble(rand);
      // Half the pairs close in size (where rounding of the sum matters most).
      const im = i % 2 === 0 ? randomDouble(rand) : re * (0.5 + rand());
      const want = Math.hypot(re, im);
      const got = hypot2(re, im);
      if (!Object.is(got, want)) {
        differ++;
        if (!first) first = `hypot(${re}, ${im}): ${got} ≠ ${want}`;
      }
    }
    expect(first).toBe('');
    expect(differ).toBe(0);
  });

  it('equals Math.hypot on any two doubles (property)', () => {
    fc.assert(
      fc.property(fc.double(), fc.double(), (re, im) => Object.is(hypot2(re, im), Math.hypot(re, im))), // prettier-ignore
      { numRuns: 20_000 },
    );
  });
});
