/**
 * The `differences` packing of a sweep column: the same rounded values as the plain packing
 * (each to its significant digits, `roundSignificant`), sent as whole counts of one decimal
 * step per column and differenced twice. A smooth trace's counts change by nearly the same
 * amount from point to point, so the second differences are small integers that repeat,
 * and the answer compresses to about a third of the plain one.
 *
 * Nothing is lost: every value is m / 10^s for an integer mantissa m (the plain packing's),
 * so with S the column's finest s, each value is the integer k = m · 10^(S − s) over 10^S.
 * The reader sums the differences back to k in exact integer arithmetic and divides by the
 * same power of ten, and a correctly rounded quotient of the same rational is the same
 * double: the values read back are identical to the plain packing's. A column whose counts
 * would not stay exact in doubles (magnitudes too far apart, non-finite values) is sent
 * plain, as an array, and read as one.
 */
import { z } from 'zod';

/** How an answer's sweep columns travel: arrays of rounded values, or differences. */
export const SWEEP_PACKINGS = ['plain', 'differences'] as const;
export type SweepPacking = (typeof SWEEP_PACKINGS)[number];

export const sweepPackingSchema = z.enum(SWEEP_PACKINGS, {
  error: `sweepPacking is one of ${SWEEP_PACKINGS.join(', ')}`,
});

/** A column in the `differences` packing. */
export interface DifferenceColumn {
  /** Every value is a whole count of 10^-decimals (negative: of 10^|decimals|). */
  decimals: number;
  /** The first count, then the first step between counts, then each step's change. */
  steps: number[];
}

/** A sweep column as either packing sends it. */
export type PackedColumn = number[] | DifferenceColumn;

/** Exact powers of ten (10^22 is the largest a double holds exactly). */
export const POW10 = Array.from({ length: 23 }, (_, i) => 10 ** i);

/**
 * The largest count a column may reach: its second differences are at most four times
 * that, and every sum the reader forms stays an exact integer.
 */
export const MAX_COUNT = Math.floor(Number.MAX_SAFE_INTEGER / 4);

/**
 * The shift `roundSignificant(v, digits)` rounds `v` at (v ≠ 0, finite): its mantissa is
 * v · 10^shift rounded to an integer.
 */
export function roundingShift(v: number, digits: number): number {
  return digits - 1 - Math.floor(Math.log10(Math.abs(v)));
}

/** The mantissa `roundSignificant` keeps for `v` at `shift` (|shift| ≤ 22). */
export function roundedMantissa(v: number, shift: number): number {
  return shift >= 0 ? Math.round(v * POW10[shift]) : Math.round(v / POW10[-shift]);
}

/**
 * The first pass of `columnCounts`: fills `mantissas` with each value's rounded mantissa
 * (`roundedMantissa` at its own shift; a zero's is 0) and `shifts` with that shift, and
 * returns the finest shift (0 for a column of zeros), or undefined when the column must go
 * plain (a non-finite value, a shift without an exact power of ten). Both arrays must hold
 * `values.length` numbers. A value's count is then its mantissa · 10^(finest − shift).
 */
export function columnMantissas(
  values: ArrayLike<number>,
  digits: number,
  mantissas: { [i: number]: number },
  shifts: { [i: number]: number },
): number | undefined {
  const n = values.length;
  let finest = -Infinity;
  // The decade of the value before, and the bounds well inside it: a value within them has
  // that decade's shift without a logarithm (neighbouring points mostly share a decade).
  let shift = 0;
  let low = Infinity;
  let high = -Infinity;
  for (let i = 0; i < n; i++) {
    const v = values[i];
    if (v === 0) {
      mantissas[i] = 0;
      shifts[i] = shift;
      continue;
    }
    const a = v < 0 ? -v : v;
    if (!(a > low && a < high)) {
      if (!Number.isFinite(v)) return undefined;
      const decade = Math.floor(Math.log10(a));
      shift = digits - 1 - decade;
      if (shift > 22 || shift < -22) return undefined;
      // A relative margin far above Math.log10's error, so that inside the bounds the
      // logarithm would give the same decade.
      low = decade >= -300 && decade <= 300 ? 10 ** decade * (1 + 1e-9) : Infinity;
      high = decade >= -300 && decade <= 300 ? 10 ** (decade + 1) * (1 - 1e-9) : -Infinity;
      if (shift > finest) finest = shift;
    }
    shifts[i] = shift;
    mantissas[i] = roundedMantissa(v, shift);
  }
  return finest === -Infinity ? 0 : finest;
}

/**
 * Fills `counts` with the column's counts at its finest decimal step and returns that
 * step's `decimals`, or undefined when the column must go plain (a non-finite value, a
 * shift without an exact power of ten, a count beyond `MAX_COUNT`). `counts` must hold
 * `values.length` numbers.
 */
export function columnCounts(
  values: ArrayLike<number>,
  digits: number,
  counts: { [i: number]: number },
): number | undefined {
  const n = values.length;
  if (shifts.length < n) shifts = new Int32Array(Math.max(n, 2 * shifts.length));
  const finest = columnMantissas(values, digits, counts, shifts);
  if (finest === undefined) return undefined;
  for (let i = 0; i < n; i++) {
    const k = countOf(counts[i], shifts[i], finest);
    if (k !== k) return undefined;
    counts[i] = k;
  }
  return finest;
}

/**
 * The count of mantissa `m` (rounded at `shift`) in steps of the column's finest shift, or
 * NaN when it cannot be sent exactly (no exact power of ten, or beyond `MAX_COUNT`).
 */
export function countOf(m: number, shift: number, finest: number): number {
  // A zero (any other value keeps a mantissa of `digits` digits); never -0 on the wire.
  if (m === 0) return 0;
  const widen = finest - shift;
  if (widen > 22) return NaN;
  const k = m * POW10[widen];
  // |m| < 2^53 always; the product is exact while it stays at most MAX_COUNT.
  return Math.abs(k) <= MAX_COUNT ? k : NaN;
}

/** Each value's rounding shift, between the two passes of `columnCounts` (reused). */
let shifts = new Int32Array(1024);

/** The counts differenced twice: the first, the first step, then each step's change. */
export function secondDifferences(counts: ArrayLike<number>, out: { [i: number]: number }): void {
  for (let i = 0; i < counts.length; i++) {
    if (i === 0) out[i] = counts[0];
    else if (i === 1) out[i] = counts[1] - counts[0];
    else out[i] = counts[i] - 2 * counts[i - 1] + counts[i - 2];
  }
}

/**
 * `values` in the `differences` packing at `digits` significant digits, or, when the column
 * cannot be sent so exactly, the plain packing's rounded values (`plain(values)`).
 */
export function packColumn(
  values: ArrayLike<number>,
  digits: number,
  plain: (values: ArrayLike<number>) => number[],
): PackedColumn {
  const counts = new Array<number>(values.length);
  const decimals = columnCounts(values, digits, counts);
  if (decimals === undefined) return plain(values);
  const steps = new Array<number>(values.length);
  secondDifferences(counts, steps);
  return { decimals, steps };
}

/** A column of either packing as the values it carries. */
export function unpackColumn(column: PackedColumn): number[] {
  if (Array.isArray(column)) return column;
  const { decimals, steps } = column;
  const values = new Array<number>(steps.length);
  let count = 0;
  let step = 0;
  for (let i = 0; i < steps.length; i++) {
    if (i === 0) count = steps[0];
    else {
      step = i === 1 ? steps[1] : step + steps[i];
      count += step;
    }
    values[i] =
      count === 0 ? 0 : decimals >= 0 ? count / POW10[decimals] : count * POW10[-decimals];
  }
  return values;
}
