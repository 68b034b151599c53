/**
 * Canonical form of measured or computed network data (one- and two-ports), and the small
 * 2×2 complex conversions the Touchstone reader and writer need.
 *
 * Layout (the same convention as the engine's ABCD sweeps in `shared/engine/types.ts`):
 * - `freqsHz`: Float64Array of length n, strictly ascending, Hz;
 * - `s`: Float64Array of re/im pairs. One-port: stride 2, point i = [S11re, S11im] at 2·i.
 *   Two-port: stride 8, point i = [S11, S12, S21, S22] (row-major, each re, im) at 8·i —
 *   row-major here whatever column order the file used.
 */
import type { MeasuredNetwork, SParamPoint } from '../engine/types';

/** S-parameters over frequency with one real reference resistance for every port. */
export interface NetworkData {
  ports: 1 | 2;
  /** Hz, strictly ascending; index i ↔ point i of `s`. */
  freqsHz: Float64Array;
  /** S re/im pairs; stride 2 (one-port) or 8 (two-port, row-major S11 S12 S21 S22). */
  s: Float64Array;
  /** Reference resistance of every port, ohm. */
  z0: number;
}

/** Number of float64 slots per frequency point in `NetworkData.s`. */
export function sStride(ports: 1 | 2): number {
  return ports === 1 ? 2 : 8;
}

/** The contract's JSON-friendly form (`MeasuredNetwork`), used by stage builders. */
export function toMeasuredNetwork(data: NetworkData): MeasuredNetwork {
  const stride = sStride(data.ports);
  const points: SParamPoint[] = [];
  for (let i = 0; i < data.freqsHz.length; i++) {
    const o = stride * i;
    const c = (k: number) => ({ re: data.s[o + 2 * k], im: data.s[o + 2 * k + 1] });
    const point: SParamPoint = { f: data.freqsHz[i], z0: data.z0, s11: c(0) };
    if (data.ports === 2) {
      point.s12 = c(1);
      point.s21 = c(2);
      point.s22 = c(3);
    }
    points.push(point);
  }
  return { ports: data.ports, points };
}

/** A 2×2 complex matrix as 8 numbers [m11re, m11im, m12re, m12im, m21re, m21im, m22re, m22im]. */
type Matrix2 = Float64Array | number[];

/**
 * S from a normalised impedance or admittance matrix (one- or two-port), written into
 * `out[o..]`. For impedance (`kind` 'Z'): S = (z − I)(z + I)⁻¹; for admittance ('Y'):
 * S = (I − y)(I + y)⁻¹. `m` is row-major like `NetworkData.s`; a one-port uses m[0], m[1].
 */
export function normalisedToS(
  kind: 'Z' | 'Y',
  ports: 1 | 2,
  m: Matrix2,
  out: Float64Array,
  o: number,
): void {
  const sign = kind === 'Z' ? 1 : -1;
  if (ports === 1) {
    // (z − 1)/(z + 1) or (1 − y)/(1 + y)
    const nre = sign * (m[0] - 1);
    const nim = sign * m[1];
    divide(nre, nim, m[0] + 1, m[1], out, o);
    return;
  }
  // N = sign·(M − I) (z − I or I − y), P = M + I; S = N·P⁻¹.
  const n = [
    sign * (m[0] - 1),
    sign * m[1],
    sign * m[2],
    sign * m[3],
    sign * m[4],
    sign * m[5],
    sign * (m[6] - 1),
    sign * m[7],
  ];
  const p = [m[0] + 1, m[1], m[2], m[3], m[4], m[5], m[6] + 1, m[7]];
  const inv = new Float64Array(8);
  invert2(p, inv);
  multiply2(n, inv, out, o);
}

/** Impedance seen into a one-port of reflection s against real z0: z0·(1 + s)/(1 − s). */
export function reflectionToImpedance(sre: number, sim: number, z0: number): [number, number] {
  const out = new Float64Array(2);
  divide(1 + sre, sim, 1 - sre, -sim, out, 0);
  return [out[0] * z0, out[1] * z0];
}

function divide(ar: number, ai: number, br: number, bi: number, out: Float64Array, o: number) {
  const den = br * br + bi * bi;
  out[o] = (ar * br + ai * bi) / den;
  out[o + 1] = (ai * br - ar * bi) / den;
}

function invert2(m: Matrix2, out: Float64Array): void {
  const detRe = m[0] * m[6] - m[1] * m[7] - (m[2] * m[4] - m[3] * m[5]);
  const detIm = m[0] * m[7] + m[1] * m[6] - (m[2] * m[5] + m[3] * m[4]);
  divide(m[6], m[7], detRe, detIm, out, 0);
  divide(-m[2], -m[3], detRe, detIm, out, 2);
  divide(-m[4], -m[5], detRe, detIm, out, 4);
  divide(m[0], m[1], detRe, detIm, out, 6);
}

function multiply2(x: Matrix2, y: Matrix2, out: Float64Array, o: number): void {
  for (let r = 0; r < 2; r++) {
    for (let c = 0; c < 2; c++) {
      const p = 4 * r; // x row r: x[p], x[p+2]
      const q = 2 * c; // y column c: y[q], y[q+4]
      const re = x[p] * y[q] - x[p + 1] * y[q + 1] + x[p + 2] * y[q + 4] - x[p + 3] * y[q + 5];
      const im = x[p] * y[q + 1] + x[p + 1] * y[q] + x[p + 2] * y[q + 5] + x[p + 3] * y[q + 4];
      out[o + p + q] = re;
      out[o + p + q + 1] = im;
    }
  }
}
