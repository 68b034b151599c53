/**
 * Number formatting for the engine's messages (flags and validation issues) and the CLI's
 * tables: plain significant figures here, engineering prefixes from shared/units.
 */
import { formatEngineering, significantText } from '../../units/format';
import type { UnitKind } from '../types';

/** Significant figures of the engine's messages when the caller asks for none (and for the CLI). */
export const DEFAULT_MESSAGE_FIGURES = 3;

// The figures the messages of the analysis under way are written with. The engine is
// synchronous and a thread runs one analysis at a time, so a value set for one call
// (withMessageFigures) cannot leak into another.
let messageFigures = DEFAULT_MESSAGE_FIGURES;
// The figures the caller asked for (undefined: none), for texts whose default differs.
let askedFigures: number | undefined;

/** The design assistants' figures when the caller asks for none, as they have always written. */
export const DEFAULT_DESIGN_FIGURES = 4;

/**
 * Runs `work` with the engine's messages (flags, validation issues) written to `figures`
 * significant figures; absent keeps the default. The previous value is restored after.
 */
export function withMessageFigures<T>(figures: number | undefined, work: () => T): T {
  if (figures === undefined) return work();
  const before = messageFigures;
  const askedBefore = askedFigures;
  messageFigures = figures;
  askedFigures = figures;
  try {
    return work();
  } finally {
    messageFigures = before;
    askedFigures = askedBefore;
  }
}

/**
 * A value a design assistant computed (a minimum Q, a designed part), for its texts: the
 * caller's figures (else 4), trailing zeros kept as results are on screen ("4.360").
 */
export function formatDesignResult(value: number): string {
  return significantText(value, askedFigures ?? DEFAULT_DESIGN_FIGURES, true);
}

/** A value the user stated, in a design assistant's text: rounded the same way, never padded. */
export function formatDesignStated(value: number): string {
  return significantText(value, askedFigures ?? DEFAULT_DESIGN_FIGURES);
}

/** A number to `digits` significant figures without trailing zeros ("2.5", "182", "0.17"). */
export function formatNumber(value: number, digits = messageFigures): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return '0';
  return String(Number(value.toPrecision(digits)));
}

/**
 * A value with an SI prefix and unit symbol: 77500, 'hertz' → "77.5 kHz". The one
 * engineering formatter of the project (shared/units) writes it, so messages, the CLI
 * and the screens spell values alike.
 */
export function formatQuantity(value: number, unit: UnitKind, digits = messageFigures): string {
  return formatEngineering(value, unit, digits);
}

/** Frequency shorthand used by messages. */
export function hz(value: number): string {
  return formatQuantity(value, 'hertz');
}
