/**
 * Number formatting for the engine's messages (flags and validation issues) and the CLI's
 * tables: plain significant figures here, engineering prefixes from shared/units.
 */
import { formatEngineering } from '../../units/format';
import type { UnitKind } from '../types';

/** A number to `digits` significant figures without trailing zeros ("2.5", "182", "0.17"). */
export function formatNumber(value: number, digits = 3): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return '0';
  return String(Number(value.toPrecision(digits)));
}

/**
 * A value with an SI prefix and unit symbol: 77500, 'hertz' → "77.5 kHz". The one
 * engineering formatter of the project (shared/units) writes it, so messages, the CLI
 * and the screens spell values alike.
 */
export function formatQuantity(value: number, unit: UnitKind, digits = 3): string {
  return formatEngineering(value, unit, digits);
}

/** Frequency shorthand used by messages. */
export function hz(value: number): string {
  return formatQuantity(value, 'hertz');
}
