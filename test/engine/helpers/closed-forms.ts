/**
 * What the closed-form checks of the example chains share: each example loaded and analysed
 * once, complex arithmetic, and the textbook figures they compare against.
 *
 * Element models are those ENGINE.md states (constant Q): a coil of quality Q has series
 * resistance ωL/Q, a capacitor a parallel conductance ωC/Q. Series-to-parallel conversion
 * Rp = ωL(Q + 1/Q), Lp = L(1 + 1/Q²) and loaded Q = R∥/(ωLp) are REFERENCES.md LQ-3.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { analyzeChain, type AnalysisResult } from '../../../shared/engine';
import { chainDocumentSchema, type ChainDocument, type StageInstance } from '../../../shared/schema/chain'; // prettier-ignore
// ---------------------------------------------------------------- loading

export const DIR = path.join(__dirname, '..', '..', '..', 'examples');
export const cache = new Map<string, { doc: ChainDocument; res: AnalysisResult }>();
export function example(key: string) {
  let hit = cache.get(key);
  if (!hit) {
    const { variantOf: _v, ...raw } = JSON.parse(readFileSync(path.join(DIR, `${key}.chain.json`), 'utf8')); // prettier-ignore
    const doc = chainDocumentSchema.parse(raw);
    hit = { doc, res: analyzeChain(doc, { sweep: true }) };
    cache.set(key, hit);
  }
  return hit;
}
export const stageOf = (doc: ChainDocument, id: string): StageInstance => {
  const s = doc.stages.find((x) => x.id === id);
  if (!s) throw new Error(`example has no stage "${id}"`);
  return s;
};
export const num = (s: StageInstance, key: string) => s.values[key] as number;
export const resonator = (res: AnalysisResult, stageId: string, label = 'tank') =>
  res.resonators.find((r) => r.stageId === stageId && r.label === label)!;
/** User-level node after the stage with this id (node 0 is the source terminal). */
export const nodeAfter = (doc: ChainDocument, id: string) =>
  doc.stages.findIndex((s) => s.id === id);
export const flagsOf = (res: AnalysisResult, code: string) =>
  res.flags.filter((f) => f.code === code);
export const rel = (a: number | null | undefined, b: number) => Math.abs((a as number) / b - 1);

// ---------------------------------------------------------------- complex arithmetic

export interface Cx {
  re: number;
  im: number;
}
export const cx = (re: number, im = 0): Cx => ({ re, im });
export const add = (...zs: Cx[]) => zs.reduce((a, b) => cx(a.re + b.re, a.im + b.im), cx(0));
export const mul = (a: Cx, b: Cx) => cx(a.re * b.re - a.im * b.im, a.re * b.im + a.im * b.re);
export const inv = (a: Cx) => {
  const d = a.re * a.re + a.im * a.im;
  return cx(a.re / d, -a.im / d);
};
export const div = (a: Cx, b: Cx) => mul(a, inv(b));
export const neg = (a: Cx) => cx(-a.re, -a.im);
export const abs = (a: Cx) => Math.hypot(a.re, a.im);
export const scale = (a: Cx, k: number) => cx(a.re * k, a.im * k);
export const db20 = (x: number) => 20 * Math.log10(x);
export const db10 = (x: number) => 10 * Math.log10(x);
export const fromDb10 = (db: number) => 10 ** (db / 10);
export const w = (f: number) => 2 * Math.PI * f;

/** Coil impedance ωL/Q + jωL and capacitor admittance ωC/Q + jωC (ENGINE.md, constant Q). */
export const zCoil = (f: number, l: number, q: number) => cx((w(f) * l) / q, w(f) * l);
export const yCap = (f: number, c: number, q = Infinity) => cx((w(f) * c) / q, w(f) * c);
export const zCap = (f: number, c: number, q = Infinity) => inv(yCap(f, c, q));
/** R ∥ C admittance. */
export const yRc = (f: number, r: number, c: number) => cx(1 / r, w(f) * c);

/** Coil's parallel equivalent: Rp = ωL(Q + 1/Q), Lp = L(1 + 1/Q²) (LQ-3). */
export const coilParallel = (f: number, l: number, q: number) => ({
  rp: w(f) * l * (q + 1 / q),
  lp: l * (1 + 1 / (q * q)),
});

/**
 * Available gain of a unilateral stage given as stated gain G between rin and rout, driven
 * from source impedance zs: with gm = 2√(G/(rin·rout)) (the catalogue's definition of a
 * stated gain), GA = gm²·|Zin/(Zs + Zin)|²·rout·Re Zs.
 */
export function unilateralGa(
  statedDb: number,
  rin: number,
  cin: number,
  rout: number,
  zs: Cx,
  f: number,
) {
  const gm = 2 * Math.sqrt(fromDb10(statedDb) / (rin * rout));
  const zin = inv(yRc(f, rin, cin));
  const t = abs(div(zin, add(zs, zin)));
  return gm * gm * t * t * rout * zs.re;
}

/** Friis: F = F1 + (F2 − 1)/G1 + (F3 − 1)/(G1·G2) + … (linear). */
export function friisTotal(stages: { f: number; g: number }[]): number {
  let f = 1;
  let g = 1;
  for (const s of stages) {
    f += (s.f - 1) / g;
    g *= s.g;
  }
  return f;
}

/**
 * Two shunt capacitors joined by coupled coils (M = k·L, each with loss ωL/Q), driven by a
 * Norton current i with source admittance ys, loaded by yl. Solves the two-node admittance
 * equations [Y11+ya, Y12; Y12, Y22+yb]·[V1; V2] = [i; 0], with Y the inverse of the coils'
 * Z-matrix [[z, jωM], [jωM, z]]. Returns the output voltage, the output's Thevenin
 * impedance (load removed) and the open-circuit voltage.
 */
export function coupledPair(
  f: number,
  p: { l: number; c: number; ql: number; qc: number; k: number },
  i: Cx,
  ys: Cx,
  yl: Cx,
) {
  const z = zCoil(f, p.l, p.ql);
  const zm = cx(0, w(f) * p.k * p.l);
  const det = add(mul(z, z), neg(mul(zm, zm)));
  const y11 = div(z, det);
  const y12 = neg(div(zm, det));
  const yc = yCap(f, p.c, p.qc);
  const a11 = add(y11, yc, ys);
  const a22open = add(y11, yc);
  const a22 = add(a22open, yl);
  const v2 = div(neg(mul(y12, i)), add(mul(a11, a22), neg(mul(y12, y12))));
  const v2open = div(neg(mul(y12, i)), add(mul(a11, a22open), neg(mul(y12, y12))));
  const zth = inv(add(a22open, neg(div(mul(y12, y12), a11))));
  return { v2, v2open, zth };
}

/** Real root of g on [lo, hi] by bisection (g changes sign across the bracket). */
export function root(g: (x: number) => number, lo: number, hi: number): number {
  const sLo = Math.sign(g(lo));
  for (let k = 0; k < 200; k++) {
    const mid = 0.5 * (lo + hi);
    if (Math.sign(g(mid)) === sLo) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/** Peak EMF of a generator with available power P (dBm): P = Es²/(8R) (ENGINE.md, peak phasors). */
export const emfOf = (s: StageInstance) => Math.sqrt(8 * num(s, 'r') * 1e-3 * 10 ** (num(s, 'powerDbm') / 10)); // prettier-ignore
/** Loss (dB) of a line of `lossDbPerM` at refHz, scaled with √f (the catalogue's conductor-loss model). */
export const lineLossDb = (s: StageInstance, f: number) =>
  num(s, 'lossDbPerM') * num(s, 'length') * Math.sqrt(f / num(s, 'refHz'));
/** Return loss of Zin against Zsrc* (ENGINE.md): −20·log10 |(Zin − Zsrc*)/(Zin + Zsrc)|. */
export const returnLoss = (zin: Cx, zsrc: Cx) =>
  -db20(abs(div(add(zin, neg(cx(zsrc.re, -zsrc.im))), add(zin, zsrc))));
