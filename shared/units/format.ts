/**
 * Writes SI values the way engineers read them: "22 µH", "77.5 kHz", "2.2 kΩ".
 * Pure and framework-free; no mathjs needed.
 */
import type { UnitKind } from '../engine/types';
import { UNIT_KINDS } from './kinds';

const ENGINEERING_PREFIXES: [number, string][] = [
  [1e12, 'T'],
  [1e9, 'G'],
  [1e6, 'M'],
  [1e3, 'k'],
  [1, ''],
  [1e-3, 'm'],
  [1e-6, 'µ'],
  [1e-9, 'n'],
  [1e-12, 'p'],
  [1e-15, 'f'],
];

/**
 * Formats `value` (SI, or dB/dBm/percent for those kinds) with an engineering prefix and
 * the kind's symbol, rounded to `digits` significant digits. Trailing zeros are dropped
 * ("77.5 kHz") unless `keepZeros` asks for every figure to be written ("77.50 kHz"), as the
 * screens do so that figures side by side carry the same precision. An exact zero is "0".
 * Non-finite values come out as "—" (not a number) or "∞".
 */
export function formatEngineering(
  value: number,
  unitKind: UnitKind,
  digits = 3,
  keepZeros = false,
): string {
  const info = UNIT_KINDS[unitKind];
  const join = (num: string, symbol: string) =>
    symbol === '' ? num : symbol === '%' || symbol === '°' ? `${num}${symbol}` : `${num} ${symbol}`;
  if (Number.isNaN(value)) return '—';
  if (!Number.isFinite(value)) return join(value > 0 ? '∞' : '-∞', info.symbol);
  if (!info.prefixed) return join(significantText(value, digits, keepZeros), info.symbol);
  // Far outside the prefixes (a 1e99 F slip, a 5e-324 Ω value): plain exponent form, not
  // "1e87 TF".
  const magnitude = Math.abs(value);
  if (magnitude !== 0 && (magnitude < 1e-18 || magnitude >= 1e15))
    return join(significantText(value, digits, keepZeros), info.symbol);
  const [mantissa, prefix] = scaleToPrefix(value, digits);
  return join(significantText(mantissa, digits, keepZeros), prefix + info.symbol);
}

/** Picks the prefix after rounding, so 999.96 with 3 digits reads "1 k", not "1000". */
function scaleToPrefix(value: number, digits: number): [number, string] {
  if (value === 0) return [0, ''];
  const magnitude = Math.abs(value);
  const rounded = Number(magnitude.toPrecision(digits));
  const smallest = ENGINEERING_PREFIXES[ENGINEERING_PREFIXES.length - 1];
  const chosen = ENGINEERING_PREFIXES.find(([scale]) => rounded >= scale) ?? smallest;
  return [value / chosen[0], chosen[1]];
}

/**
 * `value` to `digits` significant figures, written plainly between 1e-4 and 1e6 and in
 * exponent form outside (1e12 reads better than 1000000000000, a "lossless" Q, or 1e+12).
 * With `keepZeros` the trailing zeros stay ("50.00", "1.000e12"); a number with more
 * integer digits than figures is written out rounded ("12350" at 4 figures), as there is no
 * plain way to mark which of its zeros count.
 */
export function significantText(value: number, digits: number, keepZeros = false): string {
  if (value === 0) return '0';
  const n = Math.max(1, Math.min(Math.round(digits), 15));
  const rounded = Number(value.toPrecision(n));
  const abs = Math.abs(rounded);
  if (abs >= 1e-4 && abs < 1e6) {
    if (!keepZeros) return String(rounded);
    const text = value.toPrecision(n);
    return text.includes('e') ? String(rounded) : text;
  }
  const exponent = keepZeros ? rounded.toExponential(n - 1) : rounded.toExponential();
  return exponent.replace('e+', 'e');
}
