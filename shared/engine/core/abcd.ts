/**
 * ABCD (chain) matrices and the converters derived from them.
 *
 * Shape: one Float64Array holds a sweep; each frequency point takes 8 slots
 * `[Are, Aim, Bre, Bim, Cre, Cim, Dre, Dim]`, point i at offset 8·i. S, Z and Y results use
 * the same layout with the four entries in row order: `[X11, X12, X21, X22]` (re, im each).
 *
 * Convention: V1 = A·V2 + B·I2 and I1 = C·V2 + D·I2, with I1 flowing into port 1 and I2
 * flowing out of port 2 toward the next stage.
 */
import { cdiv, cmul } from './complex';

/** Slots per frequency point of an ABCD (or S, Z, Y) sweep. */
export const ABCD_SLOTS = 8;

/** A reference impedance: a real number of ohms or a complex value. */
export type RefImpedance = number | { re: number; im: number };

/** An identity two-port (a through connection) for `points` frequency points. */
export function identityAbcd(points: number): Float64Array {
  const out = new Float64Array(ABCD_SLOTS * points);
  for (let i = 0; i < points; i++) {
    out[8 * i] = 1;
    out[8 * i + 6] = 1;
  }
  return out;
}

/**
 * Cascade of two two-ports at one frequency: `out = a · b`.
 *
 * ```
 *        ┌─────┐     ┌─────┐
 *  1 ────┤  a  ├─────┤  b  ├──── 2
 *        └─────┘     └─────┘
 * ```
 * The output port of `a` feeds the input port of `b`. Reads all 16 inputs before writing, so
 * `out` may be `a` or `b` itself.
 */
export function cascade(
  a: Float64Array,
  ao: number,
  b: Float64Array,
  bo: number,
  out: Float64Array,
  oo: number,
): void {
  const aAr = a[ao], aAi = a[ao + 1], aBr = a[ao + 2], aBi = a[ao + 3]; // prettier-ignore
  const aCr = a[ao + 4], aCi = a[ao + 5], aDr = a[ao + 6], aDi = a[ao + 7]; // prettier-ignore
  const bAr = b[bo], bAi = b[bo + 1], bBr = b[bo + 2], bBi = b[bo + 3]; // prettier-ignore
  const bCr = b[bo + 4], bCi = b[bo + 5], bDr = b[bo + 6], bDi = b[bo + 7]; // prettier-ignore
  // A = aA·bA + aB·bC, B = aA·bB + aB·bD, C = aC·bA + aD·bC, D = aC·bB + aD·bD
  out[oo] = aAr * bAr - aAi * bAi + aBr * bCr - aBi * bCi;
  out[oo + 1] = aAr * bAi + aAi * bAr + aBr * bCi + aBi * bCr;
  out[oo + 2] = aAr * bBr - aAi * bBi + aBr * bDr - aBi * bDi;
  out[oo + 3] = aAr * bBi + aAi * bBr + aBr * bDi + aBi * bDr;
  out[oo + 4] = aCr * bAr - aCi * bAi + aDr * bCr - aDi * bCi;
  out[oo + 5] = aCr * bAi + aCi * bAr + aDr * bCi + aDi * bCr;
  out[oo + 6] = aCr * bBr - aCi * bBi + aDr * bDr - aDi * bDi;
  out[oo + 7] = aCr * bBi + aCi * bBr + aDr * bDi + aDi * bDr;
}

/**
 * Cascade of a list of two-port sweeps (a fold over {@link cascade}), first to last.
 * All sweeps must have the same number of points; an empty list gives the identity.
 */
export function cascadeAll(sweeps: readonly Float64Array[], points?: number): Float64Array {
  const n = points ?? (sweeps.length > 0 ? sweeps[0].length / ABCD_SLOTS : 0);
  for (const [k, s] of sweeps.entries()) {
    if (s.length !== ABCD_SLOTS * n) {
      throw new RangeError(
        `cascadeAll: two-port ${k} has ${s.length / ABCD_SLOTS} points, expected ${n}; ` +
          'evaluate every two-port on the same frequency grid first',
      );
    }
  }
  const out = identityAbcd(n);
  for (const s of sweeps) {
    for (let i = 0; i < n; i++) cascade(out, 8 * i, s, 8 * i, out, 8 * i);
  }
  return out;
}

function refParts(z: RefImpedance): [number, number] {
  const re = typeof z === 'number' ? z : z.re;
  const im = typeof z === 'number' ? 0 : z.im;
  if (!(re > 0) || !Number.isFinite(im)) {
    throw new RangeError(
      `abcd: reference impedance must have a real part above 0 Ω (got ${re} + j${im})`,
    );
  }
  return [re, im];
}

const t = new Float64Array(2);

/**
 * S-parameters (power waves, Kurokawa) from ABCD, for reference impedances z01 at port 1
 * and z02 at port 2 (z02 defaults to z01). With real references these are the usual
 * travelling-wave S-parameters. Output layout `[S11, S12, S21, S22]`.
 */
export function abcdToS(
  abcd: Float64Array,
  z01: RefImpedance,
  z02: RefImpedance = z01,
): Float64Array {
  const [r1, x1] = refParts(z01);
  const [r2, x2] = refParts(z02);
  const k = 2 * Math.sqrt(r1 * r2);
  const n = abcd.length / ABCD_SLOTS;
  const out = new Float64Array(abcd.length);
  for (let i = 0; i < n; i++) {
    const o = 8 * i;
    const Ar = abcd[o], Ai = abcd[o + 1], Br = abcd[o + 2], Bi = abcd[o + 3]; // prettier-ignore
    const Cr = abcd[o + 4], Ci = abcd[o + 5], Dr = abcd[o + 6], Di = abcd[o + 7]; // prettier-ignore
    // C·Z01·Z02, C·Z01*·Z02 and C·Z01·Z02*
    cmul(r1, x1, r2, x2, t, 0);
    cmul(Cr, Ci, t[0], t[1], t, 0);
    const czzR = t[0], czzI = t[1]; // prettier-ignore
    cmul(r1, -x1, r2, x2, t, 0);
    cmul(Cr, Ci, t[0], t[1], t, 0);
    const czcR = t[0], czcI = t[1]; // prettier-ignore
    cmul(r1, x1, r2, -x2, t, 0);
    cmul(Cr, Ci, t[0], t[1], t, 0);
    const cczR = t[0], cczI = t[1]; // prettier-ignore
    const aZ2r = Ar * r2 - Ai * x2, aZ2i = Ar * x2 + Ai * r2; // prettier-ignore
    const aZ2cr = Ar * r2 + Ai * x2, aZ2ci = -Ar * x2 + Ai * r2; // prettier-ignore
    const dZ1r = Dr * r1 - Di * x1, dZ1i = Dr * x1 + Di * r1; // prettier-ignore
    const dZ1cr = Dr * r1 + Di * x1, dZ1ci = -Dr * x1 + Di * r1; // prettier-ignore
    const dr = aZ2r + Br + czzR + dZ1r;
    const di = aZ2i + Bi + czzI + dZ1i;
    cdiv(aZ2r + Br - czcR - dZ1cr, aZ2i + Bi - czcI - dZ1ci, dr, di, out, o);
    const detR = Ar * Dr - Ai * Di - (Br * Cr - Bi * Ci);
    const detI = Ar * Di + Ai * Dr - (Br * Ci + Bi * Cr);
    cdiv(k * detR, k * detI, dr, di, out, o + 2);
    cdiv(k, 0, dr, di, out, o + 4);
    cdiv(-aZ2cr + Br - cczR + dZ1r, -aZ2ci + Bi - cczI + dZ1i, dr, di, out, o + 6);
  }
  return out;
}

/**
 * ABCD from S-parameters (power waves) for reference impedances z01, z02 (z02 defaults to
 * z01); the inverse of {@link abcdToS}. Each point solves the port voltages and currents for
 * the two unit incident waves and forms ABCD = [V1 I1]·[V2 I2]⁻¹, which needs S21 ≠ 0.
 * Input layout `[S11, S12, S21, S22]` per point, as abcdToS writes it.
 */
export function sToAbcd(s: Float64Array, z01: RefImpedance, z02: RefImpedance = z01): Float64Array {
  const out = new Float64Array(s.length);
  for (let o = 0; o < s.length; o += ABCD_SLOTS) sToAbcdAt(s, o, z01, z02, out, o);
  return out;
}

// Scratch of sToAbcdAt: columns for a = (1,0) and a = (0,1) (V1, I1, V2, I2out), N⁻¹, [V1 I1].
const sm = new Float64Array(16);
const sInv = new Float64Array(8);
const sLeft = new Float64Array(8);

/**
 * One point of {@link sToAbcd}: S at s[so … so+7] (`[S11, S12, S21, S22]`) to ABCD at
 * out[oo … oo+7]. The one S → ABCD conversion of the engine: measured two-ports use it too.
 * `out` may be `s` itself.
 */
export function sToAbcdAt(
  s: Float64Array,
  so: number,
  z01: RefImpedance,
  z02: RefImpedance,
  out: Float64Array,
  oo: number,
): void {
  const [r1, x1] = refParts(z01);
  const [r2, x2] = refParts(z02);
  const q1 = Math.sqrt(r1);
  const q2 = Math.sqrt(r2);
  const m = sm;
  for (let col = 0; col < 2; col++) {
    // incident waves a1, a2 and reflected b = S·a
    const a1 = col === 0 ? 1 : 0;
    const a2 = col === 0 ? 0 : 1;
    const b1r = s[so + 2 * col], b1i = s[so + 2 * col + 1]; // prettier-ignore
    const b2r = s[so + 4 + 2 * col], b2i = s[so + 5 + 2 * col]; // prettier-ignore
    // V = (Z0*·a + Z0·b)/√R0, I(into port) = (a − b)/√R0
    const v1r = (r1 * a1 + r1 * b1r - x1 * b1i) / q1;
    const v1i = (-x1 * a1 + r1 * b1i + x1 * b1r) / q1;
    const v2r = (r2 * a2 + r2 * b2r - x2 * b2i) / q2;
    const v2i = (-x2 * a2 + r2 * b2i + x2 * b2r) / q2;
    const p = 8 * col;
    m[p] = v1r;
    m[p + 1] = v1i;
    m[p + 2] = (a1 - b1r) / q1;
    m[p + 3] = -b1i / q1;
    m[p + 4] = v2r;
    m[p + 5] = v2i;
    // the ABCD convention takes the current out of port 2
    m[p + 6] = -(a2 - b2r) / q2;
    m[p + 7] = b2i / q2;
  }
  // N = [[V2a, V2b], [I2a, I2b]]; ABCD = [[V1a, V1b], [I1a, I1b]] · N⁻¹
  const nAr = m[4], nAi = m[5], nBr = m[12], nBi = m[13]; // prettier-ignore
  const nCr = m[6], nCi = m[7], nDr = m[14], nDi = m[15]; // prettier-ignore
  const detR = nAr * nDr - nAi * nDi - (nBr * nCr - nBi * nCi);
  const detI = nAr * nDi + nAi * nDr - (nBr * nCi + nBi * nCr);
  // N⁻¹ = [[nD, −nB], [−nC, nA]] / det
  cdiv(nDr, nDi, detR, detI, sInv, 0);
  cdiv(-nBr, -nBi, detR, detI, sInv, 2);
  cdiv(-nCr, -nCi, detR, detI, sInv, 4);
  cdiv(nAr, nAi, detR, detI, sInv, 6);
  sLeft[0] = m[0];
  sLeft[1] = m[1];
  sLeft[2] = m[8];
  sLeft[3] = m[9];
  sLeft[4] = m[2];
  sLeft[5] = m[3];
  sLeft[6] = m[10];
  sLeft[7] = m[11];
  cascade(sLeft, 0, sInv, 0, out, oo);
}

/** Z-parameters `[z11, z12, z21, z22]` from ABCD (needs C ≠ 0, e.g. not a bare series element). */
export function abcdToZ(abcd: Float64Array): Float64Array {
  const out = new Float64Array(abcd.length);
  for (let o = 0; o < abcd.length; o += 8) {
    const [Ar, Ai, Br, Bi, Cr, Ci, Dr, Di] = abcd.subarray(o, o + 8);
    const detR = Ar * Dr - Ai * Di - (Br * Cr - Bi * Ci);
    const detI = Ar * Di + Ai * Dr - (Br * Ci + Bi * Cr);
    cdiv(Ar, Ai, Cr, Ci, out, o);
    cdiv(detR, detI, Cr, Ci, out, o + 2);
    cdiv(1, 0, Cr, Ci, out, o + 4);
    cdiv(Dr, Di, Cr, Ci, out, o + 6);
  }
  return out;
}

/** Y-parameters `[y11, y12, y21, y22]` from ABCD (needs B ≠ 0, e.g. not a bare shunt element). */
export function abcdToY(abcd: Float64Array): Float64Array {
  const out = new Float64Array(abcd.length);
  for (let o = 0; o < abcd.length; o += 8) {
    const [Ar, Ai, Br, Bi, Cr, Ci, Dr, Di] = abcd.subarray(o, o + 8);
    const detR = Ar * Dr - Ai * Di - (Br * Cr - Bi * Ci);
    const detI = Ar * Di + Ai * Dr - (Br * Ci + Bi * Cr);
    cdiv(Dr, Di, Br, Bi, out, o);
    cdiv(-detR, -detI, Br, Bi, out, o + 2);
    cdiv(-1, 0, Br, Bi, out, o + 4);
    cdiv(Ar, Ai, Br, Bi, out, o + 6);
  }
  return out;
}

/** 20·log10 of a complex magnitude (voltage-like quantity), dB. */
export function db20(re: number, im: number): number {
  return 20 * Math.log10(Math.hypot(re, im));
}

/** Phase of a complex value in degrees, in (−180, 180]. */
export function phaseDeg(re: number, im: number): number {
  return (Math.atan2(im, re) * 180) / Math.PI;
}
