/**
 * Number formatting for the engine's messages (flags and validation issues). Display
 * formatting for screens lives at the edges; this is only what a sentence needs.
 */
import type { UnitKind } from '../types';

const UNIT_SYMBOL: Record<UnitKind, string> = {
  ohm: 'Ω',
  henry: 'H',
  farad: 'F',
  hertz: 'Hz',
  volt: 'V',
  'volt-per-metre': 'V/m',
  watt: 'W',
  siemens: 'S',
  metre: 'm',
  kelvin: 'K',
  degree: '°',
  db: 'dB',
  dbm: 'dBm',
  ratio: '',
  percent: '%',
  none: '',
};

/** Units that take SI prefixes (k, M, µ...); the rest are printed as plain numbers. */
const PREFIXED = new Set<UnitKind>(['ohm', 'henry', 'farad', 'hertz', 'volt', 'volt-per-metre', 'watt', 'siemens', 'metre']); // prettier-ignore

const PREFIXES: [number, string][] = [
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

/** The symbol of a unit kind ("Ω", "Hz", "" for ratios). */
export function unitSymbol(unit: UnitKind): string {
  return UNIT_SYMBOL[unit];
}

/** A number to `digits` significant figures without trailing zeros ("2.5", "182", "0.17"). */
export function formatNumber(value: number, digits = 3): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return '0';
  return String(Number(value.toPrecision(digits)));
}

/** A value with an SI prefix and unit symbol: 77500, 'hertz' → "77.5 kHz". */
export function formatQuantity(value: number, unit: UnitKind, digits = 3): string {
  const symbol = UNIT_SYMBOL[unit];
  if (!PREFIXED.has(unit) || value === 0 || !Number.isFinite(value)) {
    const n = formatNumber(value, digits);
    if (!symbol) return n;
    return unit === 'percent' || unit === 'degree'
      ? `${n} ${symbol}`.replace(' °', '°')
      : `${n} ${symbol}`;
  }
  const mag = Math.abs(value);
  for (const [scale, prefix] of PREFIXES) {
    // Round first so 999.96 Hz prints as "1 kHz", not "1000 Hz".
    const scaled = Number((value / scale).toPrecision(digits));
    if (Math.abs(scaled) >= 1 || scale === 1e-15) {
      if (Math.abs(scaled) >= 1000 && scale < 1e12) continue;
      return `${String(scaled)} ${prefix}${symbol}`;
    }
  }
  return `${formatNumber(mag, digits)} ${symbol}`;
}

/** Frequency shorthand used by messages. */
export function hz(value: number): string {
  return formatQuantity(value, 'hertz');
}
