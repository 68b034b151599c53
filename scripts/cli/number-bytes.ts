/**
 * The sweep table's numbers written as ASCII bytes straight into the output buffer, each
 * right-aligned in its column as `padStart` would: the same text as `value.toFixed(3)` and as
 * `formatNumber(value, digits)` (shared/engine/core/format.ts), without making a string per
 * cell. A value is rounded by scaling with an exact power of ten, which gives the decimal
 * the exact arithmetic of `toFixed`/`toPrecision` gives whenever the scaled value is not
 * within its rounding error of a half; there, and for values outside the range of the fast
 * path, the cell is the string those methods return.
 */
import { formatNumber } from '../../shared/engine';

const POW10 = Array.from({ length: 23 }, (_, i) => 10 ** i);
/**
 * Far above the scaled value's rounding error: the scaled values are below 10^9 (the fast
 * paths' limit), where one rounding of the product errs by less than 2^-23 ≈ 1.2e-7.
 */
const NEAR_HALF = 1e-6;
/** Also keeps every whole number of the fast paths below 2^31 (32-bit integer digits). */
const SCALED_LIMIT = 1e9;
const SPACE = 32;
const MINUS = 45;
const DOT = 46;
const ZERO = 48;

const { abs, floor, log10, round } = Math;
const finite = Number.isFinite;

/** Whether the rounding of `scaled` to a whole number could differ from exact arithmetic. */
function nearHalf(scaled: number): boolean {
  return abs(scaled - floor(scaled) - 0.5) < NEAR_HALF;
}

/** Decimal digits of a whole number 0 ≤ n < 2^31 (every fast path's numbers are). */
function digitCount(n: number): number {
  if (n < 1e5) return n < 10 ? 1 : n < 100 ? 2 : n < 1e3 ? 3 : n < 1e4 ? 4 : 5;
  return n < 1e6 ? 6 : n < 1e7 ? 7 : n < 1e8 ? 8 : n < 1e9 ? 9 : 10;
}

/**
 * Writes the whole number 0 ≤ n < 2^31 as exactly `k` digits (leading zeros) ending before
 * `end`, in 32-bit integer arithmetic (a division by ten becomes a multiplication).
 */
function putDigits(buf: Uint8Array, end: number, n: number, k: number): void {
  let m = n | 0;
  for (let p = end - 1; p >= end - k; p--) {
    const q = (m / 10) | 0;
    buf[p] = ZERO + (m - 10 * q);
    m = q;
  }
}

/** Spaces from `pos` up to `width` characters of a cell whose text is `len` long. */
function pad(buf: Uint8Array, pos: number, len: number, width: number): number {
  for (let k = len; k < width; k++) buf[pos++] = SPACE;
  return pos;
}

/** A cell written from its string (the slow path), right-aligned in `width` UTF-16 units. */
export function putText(buf: Uint8Array, pos: number, text: string, width: number): number {
  pos = pad(buf, pos, text.length, width);
  return pos + (buf as Buffer).write(text, pos, 'utf8');
}

/** Most bytes a cell can take beyond its width (a long fallback string, in UTF-8). */
export const CELL_SLACK = 96;

/*
 * The writers take the column and the row (`values[i]`), not the value: a number that is not
 * a small integer, passed to a function the optimiser did not inline, is boxed on the heap,
 * and a long table's millions of such boxes were most of the CLI's garbage.
 */

/**
 * `values[i].toFixed(3)` right-aligned in `width`, or `missing` for a value that is not
 * finite.
 * @returns the position after the cell
 */
export function putFixed3(
  buf: Uint8Array,
  pos: number,
  values: ArrayLike<number>,
  i: number,
  width: number,
  missing: string,
): number {
  const value = values[i];
  if (!finite(value)) return putText(buf, pos, missing, width);
  const size = abs(value);
  const scaled = size * 1000;
  if (scaled >= SCALED_LIMIT || nearHalf(scaled)) return putText(buf, pos, value.toFixed(3), width);
  const n = round(scaled);
  const whole = floor(n / 1000);
  const wholeDigits = digitCount(whole);
  // toFixed writes a minus for every negative value, "-0.000" included (but not for −0).
  const neg = value < 0 ? 1 : 0;
  const len = neg + wholeDigits + 4;
  pos = pad(buf, pos, len, width);
  if (neg) buf[pos] = MINUS;
  const end = pos + len;
  putDigits(buf, end, n - 1000 * whole, 3);
  buf[end - 4] = DOT;
  putDigits(buf, end - 4, whole, wholeDigits);
  return end;
}

/**
 * `formatNumber(values[i], digits)` right-aligned in `width` (`padEnd` when `left`): `digits`
 * significant figures, trailing zeros dropped, as `String(Number(value.toPrecision(digits)))`.
 * @returns the position after the cell
 */
export function putSignificant(
  buf: Uint8Array,
  pos: number,
  values: ArrayLike<number>,
  i: number,
  digits: number,
  width: number,
  left = false,
): number {
  const value = values[i];
  const size = abs(value);
  // Zero, non-finite values and those String() writes with an exponent take the slow path.
  if (!(size >= 1e-6) || !finite(size)) return putAligned(buf, pos, value, digits, width, left);
  const shift = digits - 1 - floor(log10(size));
  if (shift < 0 || shift >= POW10.length) return putAligned(buf, pos, value, digits, width, left);
  const scaled = size * POW10[shift];
  if (scaled >= SCALED_LIMIT || nearHalf(scaled)) {
    return putAligned(buf, pos, value, digits, width, left);
  }
  // n·10^-s is the rounded value; String() writes it with the fewest digits, so drop the
  // trailing zeros (at most ten digits remain: no two such decimals share a double).
  let n = round(scaled);
  let s = shift;
  while (s > 0 && n % 10 === 0) {
    n /= 10;
    s--;
  }
  const k = digitCount(n);
  const neg = value < 0 ? 1 : 0;
  const len = neg + (s === 0 ? k : k > s ? k + 1 : s + 2);
  if (!left) pos = pad(buf, pos, len, width);
  if (neg) buf[pos] = MINUS;
  const end = pos + len;
  if (s === 0) putDigits(buf, end, n, k);
  else if (k > s) {
    const unit = POW10[s];
    const whole = floor(n / unit);
    putDigits(buf, end, n - whole * unit, s);
    buf[end - s - 1] = DOT;
    putDigits(buf, end - s - 1, whole, k - s);
  } else {
    // "0.", zeros, then the digits.
    putDigits(buf, end, n, s);
    buf[pos + neg] = ZERO;
    buf[pos + neg + 1] = DOT;
  }
  return left ? pad(buf, end, len, width) : end;
}

function putAligned(
  buf: Uint8Array,
  pos: number,
  value: number,
  digits: number,
  width: number,
  left: boolean,
): number {
  const text = formatNumber(value, digits);
  if (!left) return putText(buf, pos, text, width);
  const end = pos + (buf as Buffer).write(text, pos, 'utf8');
  return pad(buf, end, text.length, width);
}

/** The cell as text (for tests and small tables): what the byte writers write. */
export function cellText(write: (buf: Uint8Array, pos: number) => number): string {
  const buf = Buffer.alloc(256);
  return buf.toString('utf8', 0, write(buf, 0));
}
