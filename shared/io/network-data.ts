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

/**
 * Two-port noise parameters at one frequency, as Touchstone files give them: minimum noise
 * figure, the optimum source reflection coefficient against the data's reference `z0`,
 * and the equivalent noise resistance in ohms.
 */
export interface NoisePoint {
  fHz: number;
  nfMinDb: number;
  /** Optimum source reflection coefficient (against the data's reference `z0`). */
  gammaOpt: { re: number; im: number };
  /** Equivalent noise resistance, ohm (de-normalised). */
  rnOhm: number;
}

/** S-parameters over frequency with one real reference resistance for every port. */
export interface NetworkData {
  ports: 1 | 2;
  /** Hz, strictly ascending; index i ↔ point i of `s`. */
  freqsHz: Float64Array;
  /** S re/im pairs; stride 2 (one-port) or 8 (two-port, row-major S11 S12 S21 S22). */
  s: Float64Array;
  /** Reference resistance of every port, ohm. */
  z0: number;
  /** Two-port noise parameters in ascending frequency, when the data has them. */
  noise?: NoisePoint[];
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
  if (data.noise && data.noise.length > 0) {
    return { ports: data.ports, points, noise: data.noise.map((n) => ({ ...n, z0: data.z0 })) };
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

/**
 * Renormalises two-port S given against real references r1 (port 1) and r2 (port 2) to one
 * real reference r, written into `out[o..]`. With power waves a = (V + R·I)/(2√R) and
 * b = (V − R·I)/(2√R) (K. Kurokawa, "Power Waves and the Scattering Matrix", IEEE Trans.
 * MTT-13, 1965), port i's new waves are a' = pᵢ·a + qᵢ·b and b' = qᵢ·a + pᵢ·b with
 * pᵢ = (Rᵢ + R)/(2√(Rᵢ·R)), qᵢ = (Rᵢ − R)/(2√(Rᵢ·R)), so S' = (Q + P·S)(P + Q·S)⁻¹.
 * @returns false when P + Q·S is singular (no S exists at the new reference)
 */
export function renormaliseTwoPort(
  s: Matrix2,
  r1: number,
  r2: number,
  r: number,
  out: Float64Array,
  o: number,
): boolean {
  const p = [(r1 + r) / (2 * Math.sqrt(r1 * r)), (r2 + r) / (2 * Math.sqrt(r2 * r))];
  const q = [(r1 - r) / (2 * Math.sqrt(r1 * r)), (r2 - r) / (2 * Math.sqrt(r2 * r))];
  const n = new Float64Array(8);
  const m = new Float64Array(8);
  for (let i = 0; i < 2; i++) {
    for (let j = 0; j < 2; j++) {
      const k = 4 * i + 2 * j;
      const diag = i === j ? 1 : 0;
      n[k] = q[i] * diag + p[i] * s[k];
      n[k + 1] = p[i] * s[k + 1];
      m[k] = p[i] * diag + q[i] * s[k];
      m[k + 1] = q[i] * s[k + 1];
    }
  }
  const inv = new Float64Array(8);
  invert2(m, inv);
  if (!inv.every(Number.isFinite)) return false;
  multiply2(n, inv, out, o);
  return true;
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
