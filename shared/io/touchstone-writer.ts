/**
 * Touchstone writer: one- and two-port S-parameters as a Touchstone® File Format
 * Specification Rev 1.1 file (option line, `!` comments, one point per line, two-port
 * columns N11 N21 N12 N22).
 */
import { abcdToS } from '../engine/core/abcd';
import { sStride, type NetworkData } from './network-data';

export type TouchstoneFormat = 'RI' | 'MA' | 'DB';
export type TouchstoneUnit = 'Hz' | 'kHz' | 'MHz' | 'GHz';

export interface WriteTouchstoneOptions {
  /** Number format of the data; RI keeps full precision and is the default. */
  format?: TouchstoneFormat;
  /** Frequency unit of the file; Hz by default, so frequencies are written exactly. */
  unit?: TouchstoneUnit;
  /** Comment lines written before the option line (without the `!`). */
  comments?: string[];
  /** Significant digits of every number (default 12). */
  digits?: number;
}

const UNIT_SCALE: Record<TouchstoneUnit, number> = { Hz: 1, kHz: 1e3, MHz: 1e6, GHz: 1e9 };

/**
 * Writes network data as Touchstone 1.1 text (`.s1p` for one port, `.s2p` for two).
 * @throws Error when the data's arrays do not match its port count
 */
export function writeTouchstone(data: NetworkData, options: WriteTouchstoneOptions = {}): string {
  const format = options.format ?? 'RI';
  const unit = options.unit ?? 'Hz';
  const digits = options.digits ?? 12;
  const stride = sStride(data.ports);
  if (data.s.length !== stride * data.freqsHz.length) {
    throw new Error(
      `touchstone writer: ${data.freqsHz.length} frequencies need ${stride * data.freqsHz.length} ` +
        `S values for a ${data.ports}-port, got ${data.s.length}`,
    );
  }
  const num = (v: number) => formatNumber(v, digits);
  const lines = (options.comments ?? []).map((c) => `! ${c}`.trimEnd());
  lines.push(`# ${unit.toUpperCase()} S ${format} R ${num(data.z0)}`);
  // File order of the two-port columns: S11 S21 S12 S22 (row-major slots 0, 2, 1, 3).
  const order = data.ports === 1 ? [0] : [0, 2, 1, 3];
  for (let i = 0; i < data.freqsHz.length; i++) {
    const fields = [num(data.freqsHz[i] / UNIT_SCALE[unit])];
    for (const k of order) {
      const re = data.s[stride * i + 2 * k];
      const im = data.s[stride * i + 2 * k + 1];
      fields.push(...fromRectangular(format, re, im).map(num));
    }
    lines.push(fields.join(' '));
  }
  return lines.join('\n') + '\n';
}

/**
 * Two-port S-parameters (reference z0) from an ABCD sweep in the engine's layout:
 * `abcd` has 8 slots per point, point i at 8·i, index i ↔ freqsHz[i].
 */
export function abcdSweepToNetwork(
  freqsHz: ArrayLike<number>,
  abcd: Float64Array,
  z0: number,
): NetworkData {
  if (abcd.length !== 8 * freqsHz.length) {
    throw new Error(
      `touchstone writer: ${freqsHz.length} frequencies need ${8 * freqsHz.length} ABCD slots, ` +
        `got ${abcd.length}`,
    );
  }
  if (!(z0 > 0)) throw new Error('touchstone writer: the reference resistance must be above 0 ohm');
  return { ports: 2, freqsHz: Float64Array.from(freqsHz), s: abcdToS(abcd, z0), z0 };
}

function fromRectangular(format: TouchstoneFormat, re: number, im: number): [number, number] {
  if (format === 'RI') return [re, im];
  const mag = Math.hypot(re, im);
  const deg = (Math.atan2(im, re) * 180) / Math.PI;
  return [format === 'MA' ? mag : 20 * Math.log10(mag), deg];
}

function formatNumber(v: number, digits: number): string {
  if (v === 0) return '0';
  if (!Number.isFinite(v)) {
    // A zero transmission in DB is −Infinity; Touchstone has no such number.
    return v < 0 ? '-400' : '400';
  }
  // Shortest form that keeps `digits` significant figures.
  return String(Number(v.toPrecision(digits)));
}
