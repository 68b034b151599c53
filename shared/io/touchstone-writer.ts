/**
 * Touchstone writer: one- and two-port S-parameters, with two-port noise parameters when
 * the data has them, as a Touchstone® File Format Specification Rev 1.1 file (option line,
 * `!` comments, one point per line, two-port columns N11 N21 N12 N22, the noise block after
 * the data with Rn normalised) or a Version 2.0 file (keywords, `[Two-Port Data Order]` of
 * the caller's choice, `[Noise Data]` with Rn in ohms, `[End]`). See `touchstone.ts` for
 * what the keywords mean.
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
  /** Specification version of the file (default '1.1'). */
  version?: '1.1' | '2.0';
  /** Two-port column order of a 2.0 file (default '12_21'; 1.1 files are always 21_12). */
  twoPortOrder?: '12_21' | '21_12';
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
  const v2 = options.version === '2.0';
  const order21 = !v2 || (options.twoPortOrder ?? '12_21') === '21_12';
  const noise = data.ports === 2 ? (data.noise ?? []) : [];
  if (!v2 && noise.length > 0 && noise[0].fHz > data.freqsHz[data.freqsHz.length - 1]) {
    // A 1.1 reader finds the noise block by the frequency dropping back; it cannot here.
    throw new Error(
      'touchstone writer: the first noise frequency lies above the last network frequency, ' +
        'which a 1.1 file cannot express; write version 2.0',
    );
  }
  const lines = (options.comments ?? []).map((c) => `! ${c}`.trimEnd());
  if (v2) lines.unshift('[Version] 2.0');
  lines.push(`# ${unit.toUpperCase()} S ${format} R ${num(data.z0)}`);
  if (v2) {
    lines.push(`[Number of Ports] ${data.ports}`);
    if (data.ports === 2) lines.push(`[Two-Port Data Order] ${order21 ? '21_12' : '12_21'}`);
    lines.push(`[Number of Frequencies] ${data.freqsHz.length}`);
    if (noise.length > 0) lines.push(`[Number of Noise Frequencies] ${noise.length}`);
    lines.push(`[Reference] ${Array(data.ports).fill(num(data.z0)).join(' ')}`);
    lines.push('[Network Data]');
  }
  // File order of the two-port columns: S11 S21 S12 S22 (row-major slots 0, 2, 1, 3) for
  // 21_12, S11 S12 S21 S22 for 12_21.
  const order = data.ports === 1 ? [0] : order21 ? [0, 2, 1, 3] : [0, 1, 2, 3];
  for (let i = 0; i < data.freqsHz.length; i++) {
    const fields = [num(data.freqsHz[i] / UNIT_SCALE[unit])];
    for (const k of order) {
      const re = data.s[stride * i + 2 * k];
      const im = data.s[stride * i + 2 * k + 1];
      fields.push(...fromRectangular(format, re, im).map(num));
    }
    lines.push(fields.join(' '));
  }
  if (noise.length > 0) {
    lines.push(
      v2
        ? '[Noise Data]'
        : '! noise parameters: f, NFmin dB, |Gamma opt|, angle of Gamma opt, Rn/R',
    );
    for (const n of noise) {
      const mag = Math.hypot(n.gammaOpt.re, n.gammaOpt.im);
      const deg = (Math.atan2(n.gammaOpt.im, n.gammaOpt.re) * 180) / Math.PI;
      const rn = v2 ? n.rnOhm : n.rnOhm / data.z0;
      lines.push([n.fHz / UNIT_SCALE[unit], n.nfMinDb, mag, deg, rn].map(num).join(' '));
    }
  }
  if (v2) lines.push('[End]');
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
