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

/** The two ASCII digits of every number 0–99, at twice the number. */
const PAIRS = Uint8Array.from({ length: 200 }, (_, k) =>
  k % 2 === 0 ? ZERO + Math.floor(k / 20) : ZERO + (((k - 1) / 2) % 10),
);

/**
 * Writes the whole number 0 ≤ n < 2^31 backward from `end`: `frac` digits (leading zeros
 * kept), a point when `frac` > 0, then the rest of the digits (at least one), two digits a
 * step, in 32-bit integer arithmetic (a division by a constant becomes a multiplication).
 * @returns the position of the first character written
 */
function putDecimal(buf: Uint8Array, end: number, n: number, frac: number): number {
  let m = n | 0;
  let p = end;
  if (frac > 0) {
    let d = frac;
    for (; d > 1; d -= 2) {
      const q = (m / 100) | 0;
      const r = (m - 100 * q) << 1;
      buf[--p] = PAIRS[r + 1];
      buf[--p] = PAIRS[r];
      m = q;
    }
    if (d === 1) {
      const q = (m / 10) | 0;
      buf[--p] = ZERO + (m - 10 * q);
      m = q;
    }
    buf[--p] = DOT;
  }
  while (m >= 100) {
    const q = (m / 100) | 0;
    const r = (m - 100 * q) << 1;
    buf[--p] = PAIRS[r + 1];
    buf[--p] = PAIRS[r];
    m = q;
  }
  if (m >= 10) {
    const r = m << 1;
    buf[--p] = PAIRS[r + 1];
    buf[--p] = PAIRS[r];
  } else buf[--p] = ZERO + m;
  return p;
}

/*
 * Every writer below writes into a buffer whose bytes from `pos` on are spaces already (the
 * sweep table fills its buffer with spaces once, and each row is written after the last),
 * so a right-aligned cell only skips its padding, and a gap between cells is two steps on.
 */

/** A cell written from its string (the slow path), right-aligned in `width` UTF-16 units. */
export function putText(buf: Uint8Array, pos: number, text: string, width: number): number {
  const at = text.length < width ? pos + width - text.length : pos;
  return at + (buf as Buffer).write(text, at, 'utf8');
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
  const scaled = abs(value) * 1000;
  if (scaled >= SCALED_LIMIT || nearHalf(scaled)) return putText(buf, pos, value.toFixed(3), width);
  const n = round(scaled) | 0;
  // toFixed writes a minus for every negative value, "-0.000" included (but not for −0).
  const neg = value < 0;
  const len = (neg ? 1 : 0) + digitCount((n / 1000) | 0) + 4;
  const end = len < width ? pos + width : pos + len;
  const first = putDecimal(buf, end, n, 3);
  if (neg) buf[first - 1] = MINUS;
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
  let n = round(scaled) | 0;
  let s = shift;
  while (s > 0) {
    const q = (n / 10) | 0;
    if (n !== 10 * q) break;
    n = q;
    s--;
  }
  const k = digitCount(n);
  const neg = value < 0 ? 1 : 0;
  const len = neg + (s === 0 ? k : k > s ? k + 1 : s + 2);
  const end = left || len >= width ? pos + len : pos + width;
  const first = putDecimal(buf, end, n, s);
  if (neg) buf[first - 1] = MINUS;
  return left && len < width ? pos + width : end;
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
  return text.length < width ? end + width - text.length : end;
}

/** The cell as text (for tests and small tables): what the byte writers write. */
export function cellText(write: (buf: Uint8Array, pos: number) => number): string {
  const buf = Buffer.alloc(256, ' ');
  return buf.toString('utf8', 0, write(buf, 0));
}
