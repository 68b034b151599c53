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
 * Block form of {@link unilateralAbcd} for an amplifier of transconductance gm (y21 = −gm),
 * y11 = 1/rin + jω·cin at the input frequency and y22 = 1/rout + jω'·cout at the output
 * frequency ω' (`translate`, for mixers): points f[fo … fo+n−1] into out[oo + 8·k]. The
 * arithmetic is written out here (the same divisions as the point form) so the loop calls
 * nothing that boxes a number.
 */
export function fillUnilateral(
  rin: number,
  cin: number,
  rout: number,
  cout: number,
  gm: number,
  translate: ((f: number) => number) | undefined,
  f: Float64Array,
  fo: number,
  n: number,
  out: Float64Array,
  oo: number,
): void {
  const g11 = 1 / rin;
  const g22 = 1 / rout;
  const y21r = -gm;
  for (let k = 0; k < n; k++) {
    const fk = f[fo + k];
    const w = TWO_PI * fk;
    const wOut = translate ? TWO_PI * translate(fk) : w;
    const b11 = w * cin;
    const b22 = wOut * cout;
    const pr = g11 * g22 - b11 * b22;
    const pi = g11 * b22 + b11 * g22;
    const o = oo + 8 * k;
    cdiv(-g22, -b22, y21r, 0, out, o);
    cdiv(-1, 0, y21r, 0, out, o + 2);
    cdiv(-pr, -pi, y21r, 0, out, o + 4);
    cdiv(-g11, -b11, y21r, 0, out, o + 6);
  }
}

/**
 * Block form of {@link coupledInductorsAbcd} with constant-Q windings (r = ωL/Q): points
 * f[fo … fo+n−1] into out[oo + 8·k], the arithmetic of {@link zParamsToAbcd} written out.
 */
export function fillCoupledInductors(
  l1: number,
  l2: number,
  k: number,
  q1: number,
  q2: number,
  f: Float64Array,
  fo: number,
  n: number,
  out: Float64Array,
  oo: number,
): void {
  const m = k * Math.sqrt(l1 * l2);
  for (let i = 0; i < n; i++) {
    const w = TWO_PI * f[fo + i];
    const x1 = w * l1;
    const x2 = w * l2;
    const r1 = x1 / q1;
    const r2 = x2 / q2;
    const xm = w * m;
    // z11 = r1 + jx1, z22 = r2 + jx2, z12 = z21 = jxm
    const detR = r1 * r2 - x1 * x2 - (0 * 0 - xm * xm);
    const detI = r1 * x2 + x1 * r2 - (0 * xm + xm * 0);
    const o = oo + 8 * i;
    cdiv(r1, x1, 0, xm, out, o);
    cdiv(detR, detI, 0, xm, out, o + 2);
    cinv(0, xm, out, o + 4);
    cdiv(r2, x2, 0, xm, out, o + 6);
  }
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
