/**
 * Display formatting for the results panel: engineering prefixes (through the project's
 * shared formatter), decibels, ratios and complex impedances. Values arrive in SI units
 * from the engine; nothing here parses input.
 */
import type { UnitKind } from '../../../../../shared/engine/types';
import { formatEngineering } from '../../../../../shared/units';
import { significantFigures } from '../../../core/format/number-format';

/** Shown wherever the engine has no value (no resonance in the sweep, no linearity data). */
export const NO_VALUE = '—';

function isMissing(value: number | null | undefined): value is null | undefined {
  return value === null || value === undefined || Number.isNaN(value);
}

/**
 * `value` with an engineering prefix and the kind's symbol, as the editor writes values
 * (e.g. `engineering(22e-6, 'henry')` → "22 µH"), and "—" when the engine has no value.
 * The one formatter for figures on screen: it writes the user's chosen number of
 * significant figures (`significantFigures`, default 4) unless a caller needs another.
 */
export function engineering(
  value: number | null | undefined,
  kind: UnitKind,
  digits = significantFigures(),
): string {
  if (isMissing(value)) return NO_VALUE;
  return formatEngineering(value, kind, digits);
}

/** A level or ratio in decibels with a fixed number of decimals, e.g. "-3.0 dB". */
export function decibels(value: number | null | undefined, unit = 'dB', decimals = 1): string {
  if (isMissing(value)) return NO_VALUE;
  if (!Number.isFinite(value)) return `${value > 0 ? '' : '-'}∞ ${unit}`;
  // Avoid "-0.0 dB", which reads as a loss that is not there.
  const text = value.toFixed(decimals);
  return `${Number(text) === 0 ? (0).toFixed(decimals) : text} ${unit}`;
}

/** A plain number with fixed decimals (Q values, ratios, shape factors). */
export function plain(value: number | null | undefined, decimals = 2): string {
  if (isMissing(value)) return NO_VALUE;
  if (!Number.isFinite(value)) return value > 0 ? '∞' : '-∞';
  return value.toFixed(decimals);
}

/**
 * A voltage ratio as a multiplier, e.g. "×12.5", "×0.05" or "×1410", to the user's number
 * of significant figures (trailing zeros dropped, as `engineering` drops them). Milli and
 * kilo prefixes on a bare ratio read badly, so large ratios are written out and only ratios
 * past a million or below a thousandth use exponent form.
 */
export function times(value: number | null | undefined, digits = significantFigures()): string {
  if (isMissing(value)) return NO_VALUE;
  const magnitude = Math.abs(value);
  const rounded = Number(value.toPrecision(digits));
  if (magnitude === 0 || (magnitude >= 1e-3 && magnitude < 1e6)) return `×${rounded}`;
  return `×${rounded.toExponential()}`;
}

/** A fraction 0…1 shown as a percentage. */
export function percent(fraction: number | null | undefined, decimals = 0): string {
  if (isMissing(fraction)) return NO_VALUE;
  return `${(fraction * 100).toFixed(decimals)} %`;
}

/** An angle in degrees with one decimal, never "-0.0°". */
export function degrees(value: number, decimals = 1): string {
  if (Number.isNaN(value)) return NO_VALUE;
  const text = value.toFixed(decimals);
  return `${Number(text) === 0 ? (0).toFixed(decimals) : text}°`;
}

/** A complex impedance in rectangular form, e.g. "2.4 kΩ + j150 Ω". */
export function impedanceRect(
  z: { re: number; im: number },
  digits = significantFigures(),
): string {
  if (isMissing(z.re) || isMissing(z.im)) return NO_VALUE;
  // A part a billion times smaller than the whole is rounding left over from the cascade
  // (e.g. "1.5 kΩ + j0.83 fΩ"); show it as the zero it is.
  const floor = Math.hypot(z.re, z.im) * 1e-9;
  const re = Math.abs(z.re) < floor ? 0 : z.re;
  const im = Math.abs(z.im) < floor ? 0 : z.im;
  const sign = im < 0 ? '-' : '+';
  return `${engineering(re, 'ohm', digits)} ${sign} j${engineering(Math.abs(im), 'ohm', digits)}`;
}

/** A complex impedance in polar form, e.g. "51.4 Ω ∠13.5°". */
export function impedancePolar(
  z: { re: number; im: number },
  digits = significantFigures(),
): string {
  if (isMissing(z.re) || isMissing(z.im)) return NO_VALUE;
  const magnitude = Math.hypot(z.re, z.im);
  const angle = (Math.atan2(z.im, z.re) * 180) / Math.PI;
  return `${engineering(magnitude, 'ohm', digits)} ∠${degrees(angle)}`;
}
