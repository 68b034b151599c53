/**
 * The node analysis across one section at one point (ABCD at m[o … o+7]): the steps the
 * single-point probes and the studies' judged sweeps take, and the backward and voltage
 * steps over a block of points that the node analysis runs. Arguments are arrays and indices only, so
 * calling them boxes nothing.
 */

import type { ComplexFn, RealFn } from '../types';
import { shuntVoltageSection } from './ladder-steps';

// Globals read once: inside some hosts (test runners' VM contexts) each global lookup in a
// hot loop is slow.
const finite = Number.isFinite;
const OPEN = Number.POSITIVE_INFINITY;

/** Lowest frequency a section is evaluated at after a mixer, Hz. */
export const MIN_NODE_HZ = 1e-3;

/**
 * The voltage at the source terminal (index `to`) from the EMF (`emf[e]`) and the source
 * impedance and Zin at node 0 (index `to`): V0 = e·Zin/(Zs + Zin); an open node gives e,
 * an open source 0 V.
 */
export function sourceStep(
  emf: Float64Array,
  zsRe: Float64Array,
  zsIm: Float64Array,
  zinRe: Float64Array,
  zinIm: Float64Array,
  vRe: Float64Array,
  vIm: Float64Array,
  e: number,
  to: number,
): void {
  const em = emf[e];
  const sr = zsRe[to];
  const si = zsIm[to];
  const z0r = zinRe[to];
  const z0i = zinIm[to];
  if (!finite(z0r) || !finite(z0i)) {
    vRe[to] = em;
    vIm[to] = 0;
  } else if (!finite(sr) || !finite(si)) {
    vRe[to] = 0;
    vIm[to] = 0;
  } else {
    const dr = sr + z0r;
    const di = si + z0i;
    const d2 = dr * dr + di * di;
    vRe[to] = (em * (z0r * dr + z0i * di)) / d2;
    vIm[to] = (em * (z0i * dr - z0r * di)) / d2;
  }
}

/**
 * Zin at the section's input (index `to`) from Zin at its output (`from`):
 * (A·Z + B)/(C·Z + D); an open output (non-finite Z) gives A/C, a zero denominator an open.
 */
export function backStep(
  m: Float64Array,
  o: number,
  re: Float64Array,
  im: Float64Array,
  from: number,
  to: number,
): void {
  backSection(m, o, re, im, to, from - to, 1);
}

/**
 * {@link backStep} over a block of `n` points: Zin at `at + k` from Zin at `at + P + k`, the
 * section's ABCD of point k at m[mj + 8k …]. Written out in one loop, so a cold run (the
 * CLI's one analysis) calls nothing per point; `x - x === 0` is Number.isFinite for numbers.
 */
export function backSection(
  m: Float64Array,
  mj: number,
  re: Float64Array,
  im: Float64Array,
  at: number,
  P: number,
  n: number,
): void {
  for (let k = 0; k < n; k++) {
    const o = mj + 8 * k;
    const from = at + P + k;
    const zr = re[from];
    const zi = im[from];
    // A and C read once, before the branch, for both of its ways (measurably faster in
    // the optimised loop than each way reading its own).
    const a0 = m[o];
    const a1 = m[o + 1];
    const c0 = m[o + 4];
    const c1 = m[o + 5];
    let nr: number, ni: number, dr: number, di: number; // prettier-ignore
    if (zr - zr === 0 && zi - zi === 0) {
      nr = a0 * zr - a1 * zi + m[o + 2];
      ni = a0 * zi + a1 * zr + m[o + 3];
      dr = c0 * zr - c1 * zi + m[o + 6];
      di = c0 * zi + c1 * zr + m[o + 7];
    } else {
      nr = a0;
      ni = a1;
      dr = c0;
      di = c1;
    }
    const d2 = dr * dr + di * di;
    if (d2 === 0) {
      re[at + k] = OPEN;
      im[at + k] = 0;
    } else {
      const inv = 1 / d2; // one division, two products
      re[at + k] = (nr * dr + ni * di) * inv;
      im[at + k] = (ni * dr - nr * di) * inv;
    }
  }
}

/** Zsrc at the section's output (`to`) from Zsrc at its input (`from`): (D·Z + B)/(C·Z + A). */
export function forwardStep(
  m: Float64Array,
  o: number,
  re: Float64Array,
  im: Float64Array,
  from: number,
  to: number,
): void {
  const sr = re[from];
  const si = im[from];
  let nr: number, ni: number, dr: number, di: number; // prettier-ignore
  if (finite(sr) && finite(si)) {
    nr = m[o + 6] * sr - m[o + 7] * si + m[o + 2];
    ni = m[o + 6] * si + m[o + 7] * sr + m[o + 3];
    dr = m[o + 4] * sr - m[o + 5] * si + m[o];
    di = m[o + 4] * si + m[o + 5] * sr + m[o + 1];
  } else {
    nr = m[o + 6];
    ni = m[o + 7];
    dr = m[o + 4];
    di = m[o + 5];
  }
  const d2 = dr * dr + di * di;
  if (d2 === 0) {
    re[to] = OPEN;
    im[to] = 0;
  } else {
    const inv = 1 / d2;
    re[to] = (nr * dr + ni * di) * inv;
    im[to] = (ni * dr - nr * di) * inv;
  }
}

/**
 * V at the section's output (`to`) from V at its input (`from`): V/(A + B·Y) with
 * Y = 1/Zin(out) (0 when open; a shorted output or a dead input gives 0 V). For a section
 * that is one shunt admittance (`shunt`, Section.ladder 'shunt') V itself: see {@link voltageSection}.
 */
export function voltageStep(
  m: Float64Array,
  o: number,
  zinRe: Float64Array,
  zinIm: Float64Array,
  vRe: Float64Array,
  vIm: Float64Array,
  from: number,
  to: number,
  shunt = false,
): void {
  voltageSection(m, o, zinRe, zinIm, to, 1, vRe, vIm, from, vRe, vIm, to, shunt);
}

/**
 * {@link voltageStep} over a block of `n` points, between any places: V at the output into
 * vOutRe/vOutIm from `vOut` from V at the input (vInRe/vInIm from `vIn`) and Zin at the output
 * (zRe/zIm from `zAt`), the section's ABCD of point k at m[mj + 8k …]. The node analysis runs
 * it past the last node whose Zsrc it keeps; elsewhere the voltage half of its fused forward
 * step is these expressions in this order, so every path gives the same voltages.
 *
 * `shunt`: the section is one admittance across the line (Section.ladder 'shunt': A = D = 1, B = 0 at
 * every point), so V/(A + B·Y) is V itself, and the step copies it, with the same two zeros
 * (a shorted output, a dead input), instead of taking two reciprocals per point. Across the
 * bench chain's twelve shunt sections that is about 3 % of a whole analysis. (The general
 * steps give V too, but through 1 + 0·Y, whose rounding can only flip the sign of a zero, and
 * a NaN where |Zin|² underflows: the copy is the exact answer.)
 */
export function voltageSection(
  m: Float64Array,
  mj: number,
  zRe: Float64Array,
  zIm: Float64Array,
  zAt: number,
  n: number,
  vInRe: Float64Array,
  vInIm: Float64Array,
  vIn: number,
  vOutRe: Float64Array,
  vOutIm: Float64Array,
  vOut: number,
  shunt = false,
): void {
  if (shunt) {
    shuntVoltageSection(zRe, zIm, zAt, n, vInRe, vInIm, vIn, vOutRe, vOutIm, vOut);
    return;
  }
  for (let k = 0; k < n; k++) {
    const o = mj + 8 * k;
    // Every value read before the first store: the input and output places may be one.
    const a0 = m[o];
    const a1 = m[o + 1];
    const b0 = m[o + 2];
    const b1 = m[o + 3];
    const ar = zRe[zAt + k];
    const ai = zIm[zAt + k];
    const vr = vInRe[vIn + k];
    const vi = vInIm[vIn + k];
    let er = a0;
    let ei = a1;
    if (ar - ar === 0 && ai - ai === 0) {
      const a2 = ar * ar + ai * ai;
      if (a2 === 0 || (vr === 0 && vi === 0)) {
        vOutRe[vOut + k] = 0;
        vOutIm[vOut + k] = 0;
        continue;
      }
      const ia = 1 / a2;
      const yr = ar * ia;
      const yi = -ai * ia;
      er += b0 * yr - b1 * yi;
      ei += b0 * yi + b1 * yr;
    }
    const ie = 1 / (er * er + ei * ei);
    vOutRe[vOut + k] = (vr * er + vi * ei) * ie;
    vOutIm[vOut + k] = (vi * er - vr * ei) * ie;
  }
}

/** One-port values at f[fo … fo+n−1] into `pair` (re, im interleaved from 0). */
export function fillComplex(
  fn: ComplexFn,
  f: Float64Array,
  fo: number,
  n: number,
  pair: Float64Array,
): void {
  if (fn.fill) fn.fill(f, fo, n, pair, 0, 2);
  else for (let k = 0; k < n; k++) fn(f[fo + k], pair, 2 * k);
}

/** Real values at f[fo … fo+n−1] into out[fo …]. */
export function fillReal(
  fn: RealFn,
  f: Float64Array,
  fo: number,
  n: number,
  out: Float64Array,
): void {
  if (fn.fill) fn.fill(f, fo, n, out, fo);
  else for (let k = 0; k < n; k++) out[fo + k] = fn(f[fo + k]);
}
