/**
 * Measured data a stage can carry in a short text parameter (the chain's values hold no
 * arrays), or receive parsed from an attached data file (BuildContext.dataFile).
 *
 * Text forms, points separated by ';', numbers by spaces or commas, frequency in Hz:
 * - one-port impedance:  "f R X; f R X; ..."   (ohms)
 * - two-port S-params:   "f s11re s11im s21re s21im s12re s12im s22re s22im; ..."
 *   against the stage's reference impedance.
 */
import { StageParameterError } from '../errors';
import type { MeasuredNetwork } from '../types';

/** Sorted sample table: frequencies and, per point, `width` values. */
export interface SampleTable {
  f: Float64Array;
  width: number;
  /** values[i·width + k] = k-th value at f[i]. */
  values: Float64Array;
}

/** Parses a ';'-separated table of rows with 1 + width numbers each. */
export function parseTable(text: string, width: number, key: string, rowForm: string): SampleTable {
  const rows = text
    .split(';')
    .map((r) => r.trim())
    .filter((r) => r.length > 0);
  if (rows.length === 0) {
    throw new StageParameterError(key, `the table is empty: write points as "${rowForm}; ..."`);
  }
  const parsed = rows.map((row, i) => {
    const nums = row.split(/[\s,]+/).map(Number);
    if (nums.length !== width + 1 || nums.some((v) => !Number.isFinite(v))) {
      throw new StageParameterError(
        key,
        `point ${i + 1} ("${row}") must be ${width + 1} numbers: ${rowForm}`,
      );
    }
    if (!(nums[0] > 0)) {
      throw new StageParameterError(key, `point ${i + 1}: the frequency must be above 0 Hz`);
    }
    return nums;
  });
  parsed.sort((a, b) => a[0] - b[0]);
  for (let i = 1; i < parsed.length; i++) {
    if (parsed[i][0] === parsed[i - 1][0]) {
      throw new StageParameterError(key, `two points share the frequency ${parsed[i][0]} Hz`);
    }
  }
  const f = new Float64Array(parsed.length);
  const values = new Float64Array(parsed.length * width);
  parsed.forEach((row, i) => {
    f[i] = row[0];
    for (let k = 0; k < width; k++) values[i * width + k] = row[k + 1];
  });
  return { f, width, values };
}

/**
 * Linear interpolation in frequency of every column into out[o..o+width-1]; outside the
 * measured range the end point is held (no extrapolation).
 */
export function interpolate(table: SampleTable, freq: number, out: Float64Array, o: number): void {
  const { f, width, values } = table;
  const n = f.length;
  if (n === 1 || freq <= f[0]) {
    for (let k = 0; k < width; k++) out[o + k] = values[k];
    return;
  }
  if (freq >= f[n - 1]) {
    for (let k = 0; k < width; k++) out[o + k] = values[(n - 1) * width + k];
    return;
  }
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (f[mid] <= freq) lo = mid;
    else hi = mid;
  }
  const t = (freq - f[lo]) / (f[hi] - f[lo]);
  for (let k = 0; k < width; k++) {
    const a = values[lo * width + k];
    out[o + k] = a + (values[hi * width + k] - a) * t;
  }
}

/** One-port impedance table (R, X) from a parsed measurement: Z = z0·(1 + S11)/(1 − S11). */
export function impedanceTableFromNetwork(net: MeasuredNetwork): SampleTable {
  if (net.ports !== 1) {
    throw new StageParameterError(
      undefined,
      'a measured antenna needs a one-port data file (.s1p)',
    );
  }
  const n = net.points.length;
  if (n === 0) throw new StageParameterError(undefined, 'the attached data file has no points');
  const f = new Float64Array(n);
  const values = new Float64Array(2 * n);
  net.points.forEach((p, i) => {
    const { re, im } = p.s11;
    const dr = 1 - re;
    const d = dr * dr + im * im;
    if (d === 0) {
      throw new StageParameterError(
        undefined,
        `S11 = 1 (an open circuit) at ${p.f} Hz cannot be used`,
      );
    }
    // (1 + s)/(1 − s) = ((1 + re) + j im)((1 − re) + j im)/|1 − s|²
    f[i] = p.f;
    values[2 * i] = (p.z0 * ((1 + re) * dr - im * im)) / d;
    values[2 * i + 1] = (p.z0 * ((1 + re) * im + im * dr)) / d;
  });
  return { f, width: 2, values };
}

/** Two-port S table (8 columns) from a parsed measurement; all points must share z0. */
export function sTableFromNetwork(net: MeasuredNetwork): { table: SampleTable; z0: number } {
  if (net.ports !== 2) {
    throw new StageParameterError(
      undefined,
      'a measured two-port needs a two-port data file (.s2p)',
    );
  }
  const n = net.points.length;
  if (n === 0) throw new StageParameterError(undefined, 'the attached data file has no points');
  const z0 = net.points[0].z0;
  const f = new Float64Array(n);
  const values = new Float64Array(8 * n);
  net.points.forEach((p, i) => {
    if (p.z0 !== z0) {
      throw new StageParameterError(undefined, 'the data file mixes reference impedances');
    }
    const zero = { re: 0, im: 0 };
    const s = [p.s11, p.s21 ?? zero, p.s12 ?? zero, p.s22 ?? zero];
    f[i] = p.f;
    s.forEach((c, k) => {
      values[8 * i + 2 * k] = c.re;
      values[8 * i + 2 * k + 1] = c.im;
    });
  });
  return { table: { f, width: 8, values }, z0 };
}
