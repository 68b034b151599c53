/**
 * Elementary two-ports and impedance helpers: the one place the catalogue's formulas live.
 *
 * Every factory writes into (out, o) and allocates nothing, so it can run inside the
 * engine's per-frequency loop. Layouts:
 * - complex value: out[o] = re, out[o+1] = im;
 * - ABCD matrix: out[o..o+7] = [Are, Aim, Bre, Bim, Cre, Cim, Dre, Dim].
 *
 *        I1 →                 → I2
 *   port 1 o──[ A B ; C D ]──o port 2      V1 = A·V2 + B·I2,  I1 = C·V2 + D·I2
 *          o─────────────────o             (I2 flows out of port 2 into the load)
 */
import { cdiv, cinv, cmul } from '../core/complex';

const TWO_PI = 2 * Math.PI;

/** Angular frequency, rad/s. */
export function omega(f: number): number {
  return TWO_PI * f;
}

// ---------------------------------------------------------------- complex helpers

// The complex arithmetic lives in the core; the catalogue uses the same functions.
export { cdiv, cinv, cmul };

/** out = z1 ∥ z2 = z1·z2/(z1 + z2). */
export function parallelZ(
  z1r: number,
  z1i: number,
  z2r: number,
  z2i: number,
  out: Float64Array,
  o: number,
): void {
  const nr = z1r * z2r - z1i * z2i;
  const ni = z1r * z2i + z1i * z2r;
  cdiv(nr, ni, z1r + z2r, z1i + z2i, out, o);
}

/** out = z1 + z2 (series combination; for admittances, the parallel combination). */
export function sumC(
  ar: number,
  ai: number,
  br: number,
  bi: number,
  out: Float64Array,
  o: number,
): void {
  out[o] = ar + br;
  out[o + 1] = ai + bi;
}

// ---------------------------------------------------------------- lossy L and C

/**
 * Impedance of an inductor, R + jωL, written to out. The loss is a fixed series resistance
 * `esr` when it is given (≥ 0), otherwise constant Q: R = ωL/Q. Q = Infinity is lossless.
 */
export function inductorZ(
  f: number,
  l: number,
  q: number,
  out: Float64Array,
  o: number,
  esr = -1,
): void {
  const x = omega(f) * l;
  out[o] = esr >= 0 ? esr : x / q;
  out[o + 1] = x;
}

/** Admittance of a capacitor, G + jωC with G = ωC/Q (constant Q; Infinity = lossless). */
export function capacitorY(f: number, c: number, q: number, out: Float64Array, o: number): void {
  const b = omega(f) * c;
  out[o] = b / q;
  out[o + 1] = b;
}

/** Impedance of a lossy capacitor, 1/(G + jωC). */
export function capacitorZ(f: number, c: number, q: number, out: Float64Array, o: number): void {
  const b = omega(f) * c;
  cinv(b / q, b, out, o);
}

/** Admittance of a lossy inductor, 1/(R + jωL). */
export function inductorY(
  f: number,
  l: number,
  q: number,
  out: Float64Array,
  o: number,
  esr = -1,
): void {
  inductorZ(f, l, q, out, o, esr);
  cinv(out[o], out[o + 1], out, o);
}

// ---------------------------------------------------------------- ABCD factories

/** Writes a full ABCD matrix from its four complex entries. */
export function setAbcd(
  out: Float64Array,
  o: number,
  ar: number,
  ai: number,
  br: number,
  bi: number,
  cr: number,
  ci: number,
  dr: number,
  di: number,
): void {
  out[o] = ar;
  out[o + 1] = ai;
  out[o + 2] = br;
  out[o + 3] = bi;
  out[o + 4] = cr;
  out[o + 5] = ci;
  out[o + 6] = dr;
  out[o + 7] = di;
}

/** Series impedance Z in the through path: [[1, Z], [0, 1]]. */
export function seriesImpedanceAbcd(zr: number, zi: number, out: Float64Array, o: number): void {
  setAbcd(out, o, 1, 0, zr, zi, 0, 0, 1, 0);
}

/** Shunt admittance Y across the line: [[1, 0], [Y, 1]]. */
export function shuntAdmittanceAbcd(yr: number, yi: number, out: Float64Array, o: number): void {
  setAbcd(out, o, 1, 0, 0, 0, yr, yi, 1, 0);
}

/** Ideal transformer with V1 = n·V2: [[n, 0], [0, 1/n]]. */
export function idealTransformerAbcd(n: number, out: Float64Array, o: number): void {
  setAbcd(out, o, n, 0, 0, 0, 0, 0, 1 / n, 0);
}

/**
 * ABCD from Z-parameters: A = z11/z21, B = (z11·z22 − z12·z21)/z21, C = 1/z21, D = z22/z21.
 * Inputs are (re, im) pairs; z21 must not be zero (no transfer).
 */
export function zParamsToAbcd(
  z11r: number,
  z11i: number,
  z12r: number,
  z12i: number,
  z21r: number,
  z21i: number,
  z22r: number,
  z22i: number,
  out: Float64Array,
  o: number,
): void {
  const detR = z11r * z22r - z11i * z22i - (z12r * z21r - z12i * z21i);
  const detI = z11r * z22i + z11i * z22r - (z12r * z21i + z12i * z21r);
  cdiv(z11r, z11i, z21r, z21i, out, o);
  cdiv(detR, detI, z21r, z21i, out, o + 2);
  cinv(z21r, z21i, out, o + 4);
  cdiv(z22r, z22i, z21r, z21i, out, o + 6);
}

/**
 * Coupled inductors L1, L2 with coupling k (M = k·√(L1·L2)) and winding resistances r1, r2
 * (Ω at this frequency): z11 = r1 + jωL1, z22 = r2 + jωL2, z12 = z21 = jωM.
 * Dot convention: both currents enter the dotted ends (positive M).
 */
export function coupledInductorsAbcd(
  f: number,
  l1: number,
  l2: number,
  k: number,
  r1: number,
  r2: number,
  out: Float64Array,
  o: number,
): void {
  const w = omega(f);
  const xm = w * k * Math.sqrt(l1 * l2);
  zParamsToAbcd(r1, w * l1, 0, xm, 0, xm, r2, w * l2, out, o);
}

/**
 * Unilateral active stage from its Y-parameters (y12 = 0; y21 = −gm for an inverting stage):
 * A = −y22/y21, B = −1/y21, C = −(y11·y22)/y21, D = −y11/y21.
 */
export function unilateralAbcd(
  y11r: number,
  y11i: number,
  y22r: number,
  y22i: number,
  y21r: number,
  y21i: number,
  out: Float64Array,
  o: number,
): void {
  const pr = y11r * y22r - y11i * y22i;
  const pi = y11r * y22i + y11i * y22r;
  cdiv(-y22r, -y22i, y21r, y21i, out, o);
  cdiv(-1, 0, y21r, y21i, out, o + 2);
  cdiv(-pr, -pi, y21r, y21i, out, o + 4);
  cdiv(-y11r, -y11i, y21r, y21i, out, o + 6);
}

/**
 * Uniform line with real characteristic impedance z0 and propagation γl = αl + jβl
 * (nepers, radians): [[cosh γl, Z0·sinh γl], [sinh γl / Z0, cosh γl]].
 */
export function transmissionLineAbcd(
  alphaL: number,
  betaL: number,
  z0: number,
  out: Float64Array,
  o: number,
): void {
  const ch = Math.cosh(alphaL);
  const sh = Math.sinh(alphaL);
  const cb = Math.cos(betaL);
  const sb = Math.sin(betaL);
  // cosh(a + jb) = cosh a·cos b + j sinh a·sin b; sinh(a + jb) = sinh a·cos b + j cosh a·sin b.
  const coshR = ch * cb;
  const coshI = sh * sb;
  const sinhR = sh * cb;
  const sinhI = ch * sb;
  setAbcd(out, o, coshR, coshI, z0 * sinhR, z0 * sinhI, sinhR / z0, sinhI / z0, coshR, coshI);
}

/**
 * Symmetric two-port matched to a real z0 with forward and reverse transmission T:
 * A = D = (1/T + T)/2, B = z0·(1/T − T)/2, C = (1/T − T)/(2·z0). Reciprocal (AD − BC = 1).
 */
export function matchedThroughAbcd(
  tr: number,
  ti: number,
  z0: number,
  out: Float64Array,
  o: number,
): void {
  const d = tr * tr + ti * ti;
  const ir = tr / d;
  const ii = -ti / d;
  const sr = (ir + tr) / 2;
  const si = (ii + ti) / 2;
  const dr = (ir - tr) / 2;
  const di = (ii - ti) / 2;
  setAbcd(out, o, sr, si, z0 * dr, z0 * di, dr / z0, di / z0, sr, si);
}

/** out = a·b for ABCD matrices (a first, nearer port 1). `out` may alias neither input. */
export function multiplyAbcd(
  a: Float64Array,
  ao: number,
  b: Float64Array,
  bo: number,
  out: Float64Array,
  o: number,
): void {
  for (let row = 0; row < 2; row++) {
    for (let col = 0; col < 2; col++) {
      const x = ao + row * 4; // a[row][0] at x, a[row][1] at x + 2
      const y = bo + col * 2; // b[0][col] at y, b[1][col] at y + 4
      const re = a[x] * b[y] - a[x + 1] * b[y + 1] + a[x + 2] * b[y + 4] - a[x + 3] * b[y + 5];
      const im = a[x] * b[y + 1] + a[x + 1] * b[y] + a[x + 2] * b[y + 5] + a[x + 3] * b[y + 4];
      out[o + row * 4 + col * 2] = re;
      out[o + row * 4 + col * 2 + 1] = im;
    }
  }
}
