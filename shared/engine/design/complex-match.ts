/**
 * Matching between complex terminations at one frequency. Port 1 faces the source side,
 * whose impedance is Zs; port 2 is terminated in ZL. A network matches when the impedance
 * seen into port 1 is Zs* (conjugate match: all available power reaches the network).
 *
 * L-sections, solved exactly with admittances (the textbook two-solution case for a complex
 * load, e.g. the "shunt element across the load" solution pair):
 * - shunt element across port 2, series element at port 1 — possible when the load's
 *   parallel resistance 1/Re(YL) is at least Re(Zs): Bt = ±√(G/Rs − G²), shunt B = Bt − BL,
 *   series X = −Xs − Im(1/(G + jBt));
 * - shunt element across port 1, series element at port 2 — possible when RL ≤ 1/Re(Ys):
 *   Xt = ±√(RL/Gs − RL²), series X = Xt − XL, shunt B = −Bs + Xt/(RL² + Xt²).
 * Pi and T reuse the real-resistance designs and absorb the terminations' reactive parts
 * into the end elements (shunt susceptances for the pi, series reactances for the T).
 */
import type { ComplexJson } from '../types';

/** One part of a ladder, in order from port 1. */
export interface LadderPart {
  place: 'series' | 'shunt';
  part: 'L' | 'C';
  /** H or F. */
  value: number;
}

/** A synthesised ladder and its highest nodal Q. */
export interface LadderDesign {
  parts: LadderPart[];
  q: number;
}

const W = (f: number) => 2 * Math.PI * f;

/** A reactance below this share of the terminations' size is no part at all. */
const NEGLIGIBLE = 1e-9;

function inv(z: ComplexJson): ComplexJson {
  const m = z.re * z.re + z.im * z.im;
  return { re: z.re / m, im: -z.im / m };
}

/** The part with series reactance x (Ω) at f, or null when x is negligible next to `scale`. */
export function seriesPart(x: number, f: number, scale: number): LadderPart | null {
  if (Math.abs(x) <= NEGLIGIBLE * scale) return null;
  return x > 0
    ? { place: 'series', part: 'L', value: x / W(f) }
    : { place: 'series', part: 'C', value: -1 / (W(f) * x) };
}

/** The part with shunt susceptance b (S) at f, or null when b is negligible next to `scale`. */
export function shuntPart(b: number, f: number, scale: number): LadderPart | null {
  if (Math.abs(b) <= NEGLIGIBLE * scale) return null;
  return b > 0
    ? { place: 'shunt', part: 'C', value: b / W(f) }
    : { place: 'shunt', part: 'L', value: -1 / (W(f) * b) };
}

function compact(parts: (LadderPart | null)[]): LadderPart[] {
  return parts.filter((p): p is LadderPart => p !== null);
}

/** Every L-section (up to four) that conjugate-matches zs at port 1 to zl at port 2. */
export function complexLSections(zs: ComplexJson, zl: ComplexJson, f: number): LadderDesign[] {
  const out: LadderDesign[] = [];
  const yl = inv(zl);
  const ys = inv(zs);
  const scaleZ = Math.max(Math.hypot(zs.re, zs.im), Math.hypot(zl.re, zl.im));
  const scaleY = 1 / Math.min(Math.hypot(zs.re, zs.im), Math.hypot(zl.re, zl.im));
  // Shunt across port 2, series at port 1.
  const d2 = yl.re / zs.re - yl.re * yl.re;
  if (d2 >= 0) {
    for (const sign of d2 === 0 ? [1] : [1, -1]) {
      const bt = sign * Math.sqrt(d2);
      const zMid = inv({ re: yl.re, im: bt });
      out.push({
        parts: compact([seriesPart(-zs.im - zMid.im, f, scaleZ), shuntPart(bt - yl.im, f, scaleY)]),
        q: Math.abs(bt) / yl.re,
      });
    }
  }
  // Shunt across port 1, series at port 2.
  const d1 = zl.re / ys.re - zl.re * zl.re;
  if (d1 >= 0) {
    for (const sign of d1 === 0 ? [1] : [1, -1]) {
      const xt = sign * Math.sqrt(d1);
      const yMid = inv({ re: zl.re, im: xt });
      out.push({
        parts: compact([shuntPart(-ys.im - yMid.im, f, scaleY), seriesPart(xt - zl.im, f, scaleZ)]),
        q: Math.abs(xt) / zl.re,
      });
    }
  }
  // A case where both forms give the same network (equal resistances) is listed once.
  return out.filter(
    (d, i) => out.findIndex((e) => JSON.stringify(e.parts) === JSON.stringify(d.parts)) === i,
  );
}

/** Parallel form of an impedance: resistance and susceptance. */
export function parallelForm(z: ComplexJson): { r: number; b: number } {
  const y = inv(z);
  return { r: 1 / y.re, b: y.im };
}

/**
 * Turns a real-termination pi (values c1, l, c2) into one for complex terminations: each
 * end's shunt susceptance loses the termination's own parallel susceptance there.
 */
export function absorbIntoPi(
  values: { c1: number; l: number; c2: number },
  zs: ComplexJson,
  zl: ComplexJson,
  f: number,
): LadderPart[] {
  const w = W(f);
  const s = parallelForm(zs);
  const l = parallelForm(zl);
  // Port 1 must present Ys* = Gs − jBs: the designed shunt gives Gs, so it takes −Bs more.
  return compact([
    shuntPart(w * values.c1 - s.b, f, 1 / s.r),
    { place: 'series', part: 'L', value: values.l },
    shuntPart(w * values.c2 - l.b, f, 1 / l.r),
  ]);
}

/** The same for a T (values l1, c, l2): the end series reactances lose the terminations'. */
export function absorbIntoT(
  values: { l1: number; c: number; l2: number },
  zs: ComplexJson,
  zl: ComplexJson,
  f: number,
): LadderPart[] {
  const w = W(f);
  return compact([
    seriesPart(w * values.l1 - zs.im, f, zs.re),
    { place: 'shunt', part: 'C', value: values.c },
    seriesPart(w * values.l2 - zl.im, f, zl.re),
  ]);
}

/**
 * Coupled coils with a chosen coupling k: the secondary L2 (reactance R2p/(2Q), a tank
 * loaded by both sides) is resonated by a shunt part across port 2 so the secondary loop is
 * resistive (R_loop), then L1 = Rs·R_loop/(ω²k²L2) sets the reflected resistance to Rs, and
 * a series part at port 1 cancels ωL1 and the source reactance.
 */
export function coupledCoilsMatch(
  zs: ComplexJson,
  zl: ComplexJson,
  f: number,
  k: number,
  q: number,
): { l1: number; l2: number; series: LadderPart | null; shunt: LadderPart | null } {
  const w = W(f);
  const yl = inv(zl);
  const x2 = 1 / yl.re / (2 * q);
  // Im(1/(GL + jBt)) = −X2  ⇔  X2·Bt² − Bt + X2·GL² = 0; the larger root tunes the tank.
  const disc = 1 - 4 * x2 * x2 * yl.re * yl.re;
  const bt = (1 + Math.sqrt(Math.max(disc, 0))) / (2 * x2);
  const rLoop = yl.re / (yl.re * yl.re + bt * bt);
  const l2 = x2 / w;
  const l1 = (zs.re * rLoop) / (w * w * k * k * l2);
  const scale = Math.hypot(zs.re, zs.im);
  return {
    l1,
    l2,
    series: seriesPart(-zs.im - w * l1, f, scale),
    shunt: shuntPart(bt - yl.im, f, yl.re),
  };
}
