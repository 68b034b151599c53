/**
 * Display formatting for the results panel: engineering prefixes (through the project's
 * shared formatter), decibels, ratios and complex impedances. Values arrive in SI units
 * from the engine; nothing here parses input.
 */
import type { UnitKind } from '../../../../../shared/engine/types';
import { formatEngineering, significantText } from '../../../../../shared/units';
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
 * significant figures (`significantFigures`, default 4) unless a caller needs another, and
 * keeps the trailing zeros ("28.70 kHz" beside "54.55 kHz"), so that figures side by side
 * show the same precision.
 */
export function engineering(
  value: number | null | undefined,
  kind: UnitKind,
  digits = significantFigures(),
): string {
  if (isMissing(value)) return NO_VALUE;
  return formatEngineering(value, kind, digits, true);
}

/**
 * An axis tick label: a round value written with the figures it needs and no trailing zeros
 * ("1 kΩ", "10 kΩ", "2.5 MHz"), since a tick marks a place on the axis, not a result.
 */
export function tickLabel(value: number, kind: UnitKind, digits: number): string {
  return formatEngineering(value, kind, digits);
}

/**
 * A stored value written into a field the user edits: at least 6 significant figures (more
 * when the user chose more), so the text reads back as the value it came from; without
 * trailing zeros, as a person would type it.
 */
export function fieldText(value: number, kind: UnitKind): string {
  return formatEngineering(value, kind, Math.max(6, significantFigures()));
}

/**
 * `value` rounded to `digits` significant figures, written plainly (exponent form only past
 * a million or below a ten-thousandth), trailing zeros kept ("2.500" at 4 figures) and
 * never "-0". With `fromUnits` the count starts at the units digit for values below one, as
 * a level in dB or an angle is read: -0.0123 dB at 4 figures is "-0.012" and 0 dB "0.000",
 * so a column of levels keeps its decimals.
 */
export function figures(value: number, digits = significantFigures(), fromUnits = false): string {
  if (!Number.isFinite(value)) return Number.isNaN(value) ? NO_VALUE : value > 0 ? '∞' : '-∞';
  const n = Math.max(1, Math.min(15, Math.round(digits)));
  if (fromUnits && Math.abs(value) < 1) return unsignedZero(value.toFixed(Math.max(0, n - 1)));
  return unsignedZero(significantText(value, n, true));
}

/** A figure that rounds to zero is written without a sign ("0.000", not "-0.000"). */
function unsignedZero(text: string): string {
  return Number(text) === 0 && text.startsWith('-') ? text.slice(1) : text;
}

/**
 * A level or ratio in decibels to the user's significant figures, counted from the units
 * digit (e.g. "-3.012 dB", "-120.7 dBm", "0.012 dB" at 4 figures).
 */
export function decibels(
  value: number | null | undefined,
  unit = 'dB',
  digits = significantFigures(),
): string {
  if (isMissing(value)) return NO_VALUE;
  return `${figures(value, digits, true)} ${unit}`;
}

/** A plain number (Q values, ratios, shape factors) to the user's significant figures. */
export function plain(value: number | null | undefined, digits = significantFigures()): string {
  if (isMissing(value)) return NO_VALUE;
  return figures(value, digits);
}

/**
 * A value stated as a nominal class rather than measured or computed (a part's tolerance, the
 * chain's set temperature): written as stated, up to the user's figures but without padding
 * zeros, so a ±2 % part reads "2", not "2.000".
 */
export function nominal(value: number | null | undefined, digits = significantFigures()): string {
  if (isMissing(value)) return NO_VALUE;
  return unsignedZero(significantText(value, digits));
}

/** A stated nominal with a prefix and unit ("150 pF", "7 MHz" from a part's datasheet line). */
export function nominalEngineering(
  value: number | null | undefined,
  kind: UnitKind,
  digits = significantFigures(),
): string {
  if (isMissing(value)) return NO_VALUE;
  return formatEngineering(value, kind, digits);
}

/**
 * A level in decibels the user states (a limit, a target, a required SNR): rounded to the
 * user's figures but not padded, so a 20 dB limit reads "20 dB" and a 0 dBm one "0 dBm".
 */
export function nominalDecibels(
  value: number | null | undefined,
  unit = 'dB',
  digits = significantFigures(),
): string {
  if (isMissing(value)) return NO_VALUE;
  return `${unsignedZero(significantText(value, digits))} ${unit}`;
}

/**
 * A voltage ratio as a multiplier, e.g. "×12.50", "×0.05000" or "×1410", to the user's
 * number of significant figures (trailing zeros kept, as `engineering` keeps them). Milli
 * and kilo prefixes on a bare ratio read badly, so large ratios are written out and only
 * ratios past a million or below a thousandth use exponent form.
 */
export function times(value: number | null | undefined, digits = significantFigures()): string {
  if (isMissing(value)) return NO_VALUE;
  const magnitude = Math.abs(value);
  if (magnitude === 0 || (magnitude >= 1e-3 && magnitude < 1e6))
    return `×${significantText(value, digits, true)}`;
  // Exponent form as `figures` and the engineering formatter write it: "×2.500e7".
  const n = Math.max(1, Math.min(15, Math.round(digits)));
  return `×${value.toExponential(n - 1).replace('e+', 'e')}`;
}

/** A fraction 0…1 shown as a percentage, to the user's significant figures. */
export function percent(
  fraction: number | null | undefined,
  digits = significantFigures(),
): string {
  if (isMissing(fraction)) return NO_VALUE;
  return `${figures(fraction * 100, digits)} %`;
}

/** An angle in degrees to the user's significant figures from the units digit, never "-0°". */
export function degrees(value: number, digits = significantFigures()): string {
  if (Number.isNaN(value)) return NO_VALUE;
  return `${figures(value, digits, true)}°`;
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
  return `${engineering(magnitude, 'ohm', digits)} ∠${degrees(angle, digits)}`;
}
