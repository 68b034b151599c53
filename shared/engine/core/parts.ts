/**
 * Immittances of lossy parts as data, evaluated in one monomorphic loop.
 *
 * Most sections of a chain are one series impedance or one shunt admittance made of
 * inductors, capacitors and resistors. Described as closures they cost the hot path a call
 * per part per frequency point, each boxing its frequency argument into a heap number. As
 * data (a `Parts` list) they are summed by {@link fillParts}, one loop over a block of
 * frequencies with the formulas inline and nothing allocated.
 *
 * Layout of a `Parts` list (Float64Array): slot 0 is 1 when the value is the reciprocal of
 * the sum (an impedance given by admittances in parallel, or the reverse), else 0; then 4
 * slots per part `[code, a, b, c]`:
 * - `PART_CONST`   a + j·b (a fixed resistance, conductance or reactance);
 * - `PART_L_Z`     R + jωL, with L = a, R = c when c ≥ 0 (a fixed ESR), else ωL/Q, Q = b;
 * - `PART_L_Y`     1/(R + jωL), same a, b, c;
 * - `PART_C_Y`     ωC/Q + jωC, C = a, Q = b (constant Q; Infinity is lossless);
 * - `PART_C_Z`     1/(ωC/Q + jωC).
 * The formulas are those of `stages/primitives.ts` (inductorZ, capacitorY and their
 * reciprocals, 1/∞ = 0), so a section described either way gives the same numbers.
 */
import type { ComplexFn } from '../types';

export const PART_CONST = 0;
export const PART_L_Z = 1;
export const PART_L_Y = 2;
export const PART_C_Y = 3;
export const PART_C_Z = 4;

/** A sum of lossy parts, optionally inverted; see the module comment for the layout. */
export type Parts = Float64Array;

const TWO_PI = 2 * Math.PI;
const finite = Number.isFinite;
const { abs } = Math;

/** The reciprocal of (re + j·im) with Smith's scaling, as `cinv`: 1/∞ = 0, 1/0 = ∞. */
function recipRe(re: number, im: number): number {
  if (!finite(re) || !finite(im)) return 0;
  if (abs(re) >= abs(im)) {
    if (re === 0) return Infinity;
    const r = im / re;
    return (1 + 0 * r) / (re + im * r);
  }
  const r = re / im;
  return (r + 0) / (im + re * r);
}

function recipIm(re: number, im: number): number {
  if (!finite(re) || !finite(im)) return 0;
  if (abs(re) >= abs(im)) {
    if (re === 0) return 0;
    const r = im / re;
    return (0 - r) / (re + im * r);
  }
  const r = re / im;
  return (0 * r - 1) / (im + re * r);
}

/**
 * Writes the value of `parts` at frequencies f[fo … fo+n−1] into out: point k's real part
 * at `oo + stride·k`, its imaginary part one slot after. Allocates nothing.
 */
export function fillParts(
  parts: Parts,
  f: Float64Array,
  fo: number,
  n: number,
  out: Float64Array,
  oo: number,
  stride: number,
): void {
  const len = parts.length;
  const invert = parts[0] !== 0;
  for (let k = 0; k < n; k++) {
    const w = TWO_PI * f[fo + k];
    let re = 0;
    let im = 0;
    for (let q = 1; q < len; q += 4) {
      const code = parts[q];
      const a = parts[q + 1];
      const b = parts[q + 2];
      if (code === PART_CONST) {
        re += a;
        im += b;
      } else if (code === PART_L_Z || code === PART_L_Y) {
        const c = parts[q + 3];
        const x = w * a;
        const r = c >= 0 ? c : x / b;
        if (code === PART_L_Z) {
          re += r;
          im += x;
        } else {
          re += recipRe(r, x);
          im += recipIm(r, x);
        }
      } else {
        const y = w * a;
        const g = y / b;
        if (code === PART_C_Y) {
          re += g;
          im += y;
        } else {
          re += recipRe(g, y);
          im += recipIm(g, y);
        }
      }
    }
    const o = oo + stride * k;
    if (invert) {
      out[o] = recipRe(re, im);
      out[o + 1] = recipIm(re, im);
    } else {
      out[o] = re;
      out[o + 1] = im;
    }
  }
}

/** One part as a list of its own. */
export function part(code: number, a: number, b = 0, c = -1): Parts {
  return Float64Array.of(0, code, a, b, c);
}

/** The sum of several lists (none of them inverted), or null when one is inverted. */
export function sumParts(lists: readonly Parts[]): Parts | null {
  if (lists.some((p) => p[0] !== 0)) return null;
  const out = new Float64Array(1 + lists.reduce((n, p) => n + p.length - 1, 0));
  let o = 1;
  for (const p of lists) {
    out.set(p.subarray(1), o);
    o += p.length - 1;
  }
  return out;
}

/** The reciprocal of a list (an impedance ↔ admittance). */
export function invertParts(parts: Parts): Parts {
  const out = Float64Array.from(parts);
  out[0] = parts[0] !== 0 ? 0 : 1;
  return out;
}

/**
 * A complex function of frequency that evaluates `parts`, carrying them (`parts`) and its
 * block form (`fill`) so sections and one-ports built from it run in the engine's loops.
 */
export function partsFn(parts: Parts): ComplexFn {
  const fs = new Float64Array(1);
  const fn: ComplexFn = (f, out, o) => {
    fs[0] = f;
    fillParts(parts, fs, 0, 1, out, o, 2);
  };
  fn.parts = parts;
  fn.fill = (f, fo, n, out, oo, stride) => fillParts(parts, f, fo, n, out, oo, stride);
  return fn;
}
