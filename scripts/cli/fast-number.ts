/**
 * `formatNumber(value, digits)` (shared/engine/core/format.ts) for the CLI's sweep table,
 * where it runs on every cell of up to 100,000 rows: the same text, in about half the time.
 * The value is rounded by scaling with an exact power of ten, which gives the same double as
 * parsing `toPrecision`'s decimal whenever the scaled value is not within rounding error of
 * a half (there, and outside the powers of ten held, it asks `toPrecision` itself).
 */
import { formatNumber } from '../../shared/engine';

const POW10 = Array.from({ length: 23 }, (_, i) => 10 ** i);
/** Far above the scaled value's rounding error (below 10^digits × 2^-53 ≈ 1e-7 for 9 digits). */
const NEAR_HALF = 1e-6;

export function fastFormatNumber(value: number, digits: number): string {
  if (value === 0 || !Number.isFinite(value)) return formatNumber(value, digits);
  const size = Math.abs(value);
  const shift = digits - 1 - Math.floor(Math.log10(size));
  if (shift < 0 || shift >= POW10.length) return formatNumber(value, digits);
  const scaled = size * POW10[shift];
  if (Math.abs(scaled - Math.floor(scaled) - 0.5) < NEAR_HALF) return formatNumber(value, digits);
  const rounded = Math.round(scaled) / POW10[shift];
  return String(value < 0 ? -rounded : rounded);
}
