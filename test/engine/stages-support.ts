/**
 * Small complex-number and two-port helpers for the stage and design tests. Deliberately
 * written apart from the engine's primitives (plain objects, textbook formulas) so the
 * tests check the catalogue against an independent computation.
 */
import type {
  BuildContext,
  ComplexFn,
  ParamValues,
  Section,
  StageDefinition,
  StageModel,
  StageModelCommon,
} from '../../shared/engine/types';

/**
 * A built model as these tests read it, whatever its role: a source or a load has no
 * sections (an empty list here), a two-port no EMF or impedance.
 */
export type AnyModel = StageModelCommon & {
  sections: Section[];
  emf?: (f: number) => number;
  impedance?: ComplexFn;
};

export interface C {
  re: number;
  im: number;
}

export const c = (re: number, im = 0): C => ({ re, im });
export const add = (a: C, b: C): C => c(a.re + b.re, a.im + b.im);
export const sub = (a: C, b: C): C => c(a.re - b.re, a.im - b.im);
export const mul = (a: C, b: C): C => c(a.re * b.re - a.im * b.im, a.re * b.im + a.im * b.re);
export const div = (a: C, b: C): C => {
  const d = b.re * b.re + b.im * b.im;
  return c((a.re * b.re + a.im * b.im) / d, (a.im * b.re - a.re * b.im) / d);
};
export const abs = (a: C): number => Math.hypot(a.re, a.im);
export const parallel = (a: C, b: C): C => div(mul(a, b), add(a, b));

/** A 2×2 complex matrix [[A, B], [C, D]]. */
export interface Abcd {
  a: C;
  b: C;
  c: C;
  d: C;
}

export function fromSlots(s: Float64Array, o = 0): Abcd {
  return {
    a: c(s[o], s[o + 1]),
    b: c(s[o + 2], s[o + 3]),
    c: c(s[o + 4], s[o + 5]),
    d: c(s[o + 6], s[o + 7]),
  };
}

export function cascade(x: Abcd, y: Abcd): Abcd {
  return {
    a: add(mul(x.a, y.a), mul(x.b, y.c)),
    b: add(mul(x.a, y.b), mul(x.b, y.d)),
    c: add(mul(x.c, y.a), mul(x.d, y.c)),
    d: add(mul(x.c, y.b), mul(x.d, y.d)),
  };
}

/** The whole stage's ABCD at f: the product of its sections in order. */
export function stageAbcd(model: { sections: Section[] }, f: number): Abcd {
  const s = new Float64Array(8);
  let m: Abcd = { a: c(1), b: c(0), c: c(0), d: c(1) };
  for (const section of model.sections) {
    s.fill(NaN);
    section.abcd(f, s, 0);
    m = cascade(m, fromSlots(s));
  }
  return m;
}

/** Impedance looking into port 1 with zl on port 2: (A·ZL + B)/(C·ZL + D). */
export function zIn(m: Abcd, zl: C): C {
  return div(add(mul(m.a, zl), m.b), add(mul(m.c, zl), m.d));
}

/** Transducer power gain from a source zs to a load zl. */
export function transducerGain(m: Abcd, zs: C, zl: C): number {
  const zin = zIn(m, zl);
  const v1 = div(zin, add(zs, zin)); // per volt of EMF
  const v2 = div(v1, add(m.a, div(m.b, zl)));
  const pl = (abs(v2) ** 2 * div(c(1), zl).re) / 2;
  const pavs = 1 / (8 * zs.re);
  return pl / pavs;
}

export const det = (m: Abcd): C => sub(mul(m.a, m.d), mul(m.b, m.c));

export function ctx(f0Hz: number): BuildContext {
  return { f0Hz, temperatureK: 290 };
}

export function build(def: StageDefinition, values: ParamValues, f0Hz: number): AnyModel {
  return { sections: [], ...def.build(values, ctx(f0Hz)) };
}

/** Reads a stage model's one-port impedance at f. */
export function impedanceAt(model: StageModel | AnyModel, f: number): C {
  const s = new Float64Array(2);
  if (!('impedance' in model) || !model.impedance) throw new Error('model has no impedance');
  model.impedance(f, s, 0);
  return c(s[0], s[1]);
}

/** Relative closeness, for toBeLessThan checks. */
export const rel = (x: number, ref: number): number => Math.abs(x - ref) / Math.abs(ref);
