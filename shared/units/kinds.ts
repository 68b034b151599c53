/**
 * What each unit kind of the stage catalogue means to a person: its symbol, the SI unit
 * the chain document stores, and how to name it in a message. Framework-free.
 */
import type { UnitKind } from '../engine/types';

export interface UnitKindInfo {
  /** Symbol shown after a formatted value ('' for plain numbers). */
  symbol: string;
  /** Whether engineering prefixes (k, M, µ...) apply to the symbol. */
  prefixed: boolean;
  /** "an inductance (H)": used in "expected an inductance (H), got ...". */
  noun: string;
  /** Unit the parser converts into (mathjs spelling); null when not a physical unit. */
  si: string | null;
  /** An example a user could type, for hints. */
  example: string;
}

export const UNIT_KINDS: Record<UnitKind, UnitKindInfo> = {
  ohm: { symbol: 'Ω', prefixed: true, noun: 'a resistance (Ω)', si: 'ohm', example: '2.2k' },
  henry: { symbol: 'H', prefixed: true, noun: 'an inductance (H)', si: 'H', example: '22 uH' },
  farad: { symbol: 'F', prefixed: true, noun: 'a capacitance (F)', si: 'F', example: '4p7' },
  hertz: { symbol: 'Hz', prefixed: true, noun: 'a frequency (Hz)', si: 'Hz', example: '77.5 kHz' },
  volt: { symbol: 'V', prefixed: true, noun: 'a voltage (V)', si: 'V', example: '10 uV' },
  ampere: { symbol: 'A', prefixed: true, noun: 'a current (A)', si: 'A', example: '3 uA' },
  'volt-per-metre': {
    symbol: 'V/m',
    prefixed: true,
    noun: 'a field strength (V/m)',
    si: 'V/m',
    example: '100 uV/m',
  },
  watt: { symbol: 'W', prefixed: true, noun: 'a power (W)', si: 'W', example: '1 mW' },
  siemens: { symbol: 'S', prefixed: true, noun: 'a conductance (S)', si: 'S', example: '40 mA/V' },
  metre: { symbol: 'm', prefixed: true, noun: 'a length (m)', si: 'm', example: '1.5 m' },
  kelvin: { symbol: 'K', prefixed: false, noun: 'a temperature (K)', si: 'K', example: '290 K' },
  degree: { symbol: '°', prefixed: false, noun: 'an angle (°)', si: 'deg', example: '45 deg' },
  db: { symbol: 'dB', prefixed: false, noun: 'a ratio in dB', si: null, example: '-3 dB' },
  dbm: {
    symbol: 'dBm',
    prefixed: false,
    noun: 'a power level (dBm)',
    si: null,
    example: '-95 dBm',
  },
  ratio: { symbol: '', prefixed: false, noun: 'a plain ratio', si: null, example: '0.25' },
  percent: { symbol: '%', prefixed: false, noun: 'a percentage (%)', si: null, example: '10 %' },
  none: { symbol: '', prefixed: false, noun: 'a plain number', si: null, example: '4' },
};

/** Dimensions a user might type by mistake, to name them in "got a ..." messages. */
export const KNOWN_DIMENSIONS: { unit: string; noun: string }[] = [
  { unit: 'ohm', noun: 'a resistance' },
  { unit: 'H', noun: 'an inductance' },
  { unit: 'F', noun: 'a capacitance' },
  { unit: 'Hz', noun: 'a frequency' },
  { unit: 's', noun: 'a time' },
  { unit: 'V', noun: 'a voltage' },
  { unit: 'V/m', noun: 'a field strength' },
  { unit: 'A', noun: 'a current' },
  { unit: 'W', noun: 'a power' },
  { unit: 'S', noun: 'a conductance' },
  { unit: 'm', noun: 'a length' },
  { unit: 'K', noun: 'a temperature' },
  { unit: 'deg', noun: 'an angle' },
  { unit: 'kg', noun: 'a mass' },
  { unit: 'J', noun: 'an energy' },
];
