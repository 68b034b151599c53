/**
 * Finding parallel resonances at a node of the node analysis and measuring their Q.
 *
 * At a node the total admittance Y(f) = 1/Zsrc + 1/Zin = G + jB holds everything attached to
 * it. Where B rises through zero there is a parallel resonance (a falling crossing is a pole
 * of B: a series resonance elsewhere). The grid only brackets a crossing; the frequency is
 * then solved for with single-frequency evaluations (probe.ts). Loaded Q = (ωr/2G)·dB/dω at ωr,
 * the derivative by a central difference. Searches run over the input frequency (what the
 * sweep varies); "rising" means rising with the node's own frequency, which falls as the input
 * rises behind a mixer whose LO is above the signal.
 */
import type { BuiltChain } from './build';
import { impedanceRow, type NodeAnalysis } from './nodes';
import type { Probe } from './probe';
import { solveBracketed } from './refine';
import { logGrid } from './sweep';

const { PI, abs, max, min } = Math;
const isFiniteNumber = Number.isFinite;

/** Grid points of the bracketing search when the sweep cannot be reused. */
export const SEARCH_POINTS = 4001;
/** Fewest sweep points in the search range for the sweep itself to bracket resonances. */
const MIN_REUSED_POINTS = 1001;
/** Relative step of the central difference for dB/dω. */
const DIFF_STEP = 1e-6;

/**
 * The input-frequency range searched for resonances: the sweep span widened to include f0;
 * a sweep narrower than 0.1 % (such as a one-point sweep) searches f0/2 … 2·f0 instead.
 */
export function searchRange(built: BuiltChain): [number, number] {
  const { f0Hz, sweep } = built.settings;
  const lo = min(sweep.startHz, f0Hz);
  const hi = max(sweep.stopHz, f0Hz);
  return hi / lo < 1.001 ? [f0Hz / 2, f0Hz * 2] : [lo, hi];
}

/**
 * The grid that brackets resonances: the sweep already computed when it spans the search
 * range with enough points (no second node analysis), else a log grid of SEARCH_POINTS.
 */
export function bracketingGrid(
  built: BuiltChain,
  sweepNa: NodeAnalysis | null,
  analyse: (freqs: Float64Array) => NodeAnalysis,
): NodeAnalysis {
  const [lo, hi] = searchRange(built);
  if (sweepNa && sweepNa.points >= MIN_REUSED_POINTS) {
    const f = sweepNa.freqs;
    if (f[0] <= lo && f[sweepNa.points - 1] >= hi) return sweepNa;
  }
  return analyse(logGrid(lo, hi, SEARCH_POINTS));
}

/** A rising crossing of B bracketed on the grid between points k and k+1. */
export interface Bracket {
  k: number;
  /** +1 when the node's frequency rises with the input there, −1 when it falls. */
  sign: number;
  /**
   * sign × the searched quantity at grid points k and k+1: the refinement starts from them
   * instead of evaluating the chain again at the bracket's ends.
   */
  lo: number;
  hi: number;
}

/**
 * Susceptance at or below this fraction of the conductance is rounding, not a tuned circuit:
 * a node between matched resistive blocks (an IF filter block between its terminations) has
 * B = 0 up to rounding, whose sign flips from point to point. A real crossing, even of a
 * circuit with a loaded Q of 0.001, moves B far more than this between grid points. Our rule.
 */
const ROUNDING_B = 1e-9;

/** G and B at `node`, grid point i, into out[0], out[1] (an open side adds nothing). */
function admittanceAt(na: NodeAnalysis, node: number, i: number, out: Float64Array): void {
  const k = impedanceRow(na, node) * na.points + i;
  let g = 0;
  let b = 0;
  const sr = na.zsrcRe[k];
  const si = na.zsrcIm[k];
  if (isFiniteNumber(sr) && isFiniteNumber(si)) {
    const d = sr * sr + si * si;
    if (d !== 0) {
      g += sr / d;
      b -= si / d;
    }
  }
  const zr = na.zinRe[k];
  const zi = na.zinIm[k];
  if (isFiniteNumber(zr) && isFiniteNumber(zi)) {
    const d = zr * zr + zi * zi;
    if (d !== 0) {
      g += zr / d;
      b -= zi / d;
    }
  }
  out[0] = g;
  out[1] = b;
}

/** B at `node`, grid point i: admittanceAt's susceptance alone (half its divisions). */
function susceptanceAt(na: NodeAnalysis, k: number): number {
  let b = 0;
  const sr = na.zsrcRe[k];
  const si = na.zsrcIm[k];
  if (isFiniteNumber(sr) && isFiniteNumber(si)) {
    const d = sr * sr + si * si;
    if (d !== 0) b -= si / d;
  }
  const zr = na.zinRe[k];
  const zi = na.zinIm[k];
  if (isFiniteNumber(zr) && isFiniteNumber(zi)) {
    const d = zr * zr + zi * zi;
    if (d !== 0) b -= zi / d;
  }
  return b;
}

/**
 * Every rising crossing of B at a node over the grid, in frequency order. Brackets where B
 * is rounding at both ends (see ROUNDING_B) are left out. The scan computes B alone; G only
 * at a crossing, for the rounding test.
 */
export function risingCrossings(na: NodeAnalysis, node: number): Bracket[] {
  const out: Bracket[] = [];
  const fl = na.fNode;
  const base = impedanceRow(na, node) * na.points;
  let y: Float64Array | null = null;
  let prev = susceptanceAt(na, base);
  for (let i = 0; i + 1 < na.points; i++) {
    const next = susceptanceAt(na, base + i + 1);
    const sign = fl[base + i + 1] >= fl[base + i] ? 1 : -1;
    const a = sign * prev;
    const b = sign * next;
    if (a < 0 && b >= 0 && isFiniteNumber(a) && isFiniteNumber(b)) {
      y ??= new Float64Array(2);
      admittanceAt(na, node, i, y);
      const prevG = y[0];
      admittanceAt(na, node, i + 1, y);
      const rounding = abs(a) <= ROUNDING_B * abs(prevG) && abs(b) <= ROUNDING_B * abs(y[0]);
      if (!rounding) out.push({ k: i, sign, lo: a, hi: b });
    }
    prev = next;
  }
  return out;
}

/** A resonance located and measured at one node. */
export interface NodeResonance {
  /** Input frequency of the resonance, Hz. */
  fIn: number;
  /** Resonance at the node's own frequency, Hz. */
  fr: number;
  /** Conductance at the node at fr, S. */
  g: number;
  /** Loaded Q (NaN when not finite and positive). */
  q: number;
  sign: number;
}

/** Writes the admittance that a measurement looks at (attached or cut open) after probe.at. */
export type AdmittanceOf = (probe: Probe, node: number, out: Float64Array) => void;

export const attached: AdmittanceOf = (p, node, out) => p.nodeAdmittance(node, out);
export const cutAt =
  (cut: number): AdmittanceOf =>
  (p, node, out) =>
    p.cutAdmittance(node, cut, out);

/**
 * Solves B = 0 on a bracket [lo, hi] (input Hz) and measures Q there.
 * @param sign orientation of the node's frequency against the input (see Bracket)
 * @param bLo sign × B at lo and at hi when known (the grid's values), else evaluated
 */
export function resonanceIn(
  probe: Probe,
  node: number,
  lo: number,
  hi: number,
  sign: number,
  y: AdmittanceOf,
  scratch: Float64Array,
  bLo?: number,
  bHi?: number,
): NodeResonance | null {
  const bAt = (f: number) => {
    probe.at(f, node);
    y(probe, node, scratch);
    return sign * scratch[1];
  };
  const fIn = solveBracketed(bAt, lo, hi, undefined, bLo, bHi);
  if (!isFiniteNumber(fIn)) return null;
  return measureAt(probe, node, fIn, sign, y, scratch);
}

/** Q = (ωr/2G)·dB/dω at input frequency fIn (the node's own ω). */
export function measureAt(
  probe: Probe,
  node: number,
  fIn: number,
  sign: number,
  y: AdmittanceOf,
  scratch: Float64Array,
): NodeResonance {
  probe.at(fIn, node);
  y(probe, node, scratch);
  const g = scratch[0];
  const fr = probe.fNode[node];
  probe.at(fIn * (1 - DIFF_STEP), node);
  y(probe, node, scratch);
  const bLo = scratch[1];
  const fLo = probe.fNode[node];
  probe.at(fIn * (1 + DIFF_STEP), node);
  y(probe, node, scratch);
  const slope = (scratch[1] - bLo) / (2 * PI * (probe.fNode[node] - fLo));
  const q = ((2 * PI * fr) / (2 * g)) * slope;
  return { fIn, fr, g, q: isFiniteNumber(q) && q > 0 ? q : NaN, sign };
}

/**
 * The outward search after its first step, for `ZeroGuess`: where it started, which way B
 * goes to its zero, the two values so far, and how to evaluate B and solve a bracket.
 */
export interface FirstStep {
  near: number;
  /** True when B is negative at `near`, so the zero lies above it. */
  up: boolean;
  prevF: number;
  prevB: number;
  f: number;
  b: number;
  span: number;
  /** Sign-adjusted B at input frequency `f`. */
  bAt(f: number): number;
  /** Whether a value of B lies past the zero (the zero is bracketed). */
  past(b: number): boolean;
  /** The zero between two frequencies whose B values bracket it, measured; null if unsolved. */
  solve(a: number, b: number, ba: number, bb: number): NodeResonance | null;
}

/**
 * A shortcut tried once, after the first outward step: the resonance found (or null for none),
 * or undefined to carry on stepping (studies/shunt-follow.ts predicts the zero by a secant).
 */
export type ZeroGuess = (step: FirstStep) => NodeResonance | null | undefined;

/**
 * The rising zero of B nearest `near` (input Hz) without a grid: steps outward from `near`
 * geometrically up to a factor `span` each way until B changes sign, then solves. Used for a
 * detached tank, whose resonance sits close to the attached one.
 * @param guess tried after the first step; without it every step is taken
 */
export function resonanceNear(
  probe: Probe,
  node: number,
  near: number,
  sign: number,
  y: AdmittanceOf,
  scratch: Float64Array,
  span = 2,
  guess?: ZeroGuess,
): NodeResonance | null {
  const bAt = (f: number) => {
    probe.at(f, node);
    y(probe, node, scratch);
    return sign * scratch[1];
  };
  const b0 = bAt(near);
  if (!isFiniteNumber(b0)) return null;
  if (b0 === 0) return measureAt(probe, node, near, sign, y, scratch);
  // B rises through the zero: below it B < 0, so look upward from a negative value.
  const up = b0 < 0;
  const past = (b: number) => isFiniteNumber(b) && (up ? b >= 0 : b < 0);
  const solve = (a: number, b: number, ba: number, bb: number) => {
    const [lo, hi, blo, bhi] = a < b ? [a, b, ba, bb] : [b, a, bb, ba];
    const fIn = solveBracketed(bAt, lo, hi, undefined, blo, bhi);
    return isFiniteNumber(fIn) ? measureAt(probe, node, fIn, sign, y, scratch) : null;
  };
  let prevF = near;
  let prevB = b0;
  for (let step = 1e-4; ; step *= 2) {
    const ratio = 1 + min(step, span - 1);
    const f = up ? near * ratio : near / ratio;
    const b = bAt(f);
    if (past(b)) return solve(prevF, f, prevB, b);
    if (!isFiniteNumber(b) || ratio >= span) return null;
    if (guess && step === 1e-4) {
      const found = guess({ near, up, prevF, prevB, f, b, span, bAt, past, solve });
      if (found !== undefined) return found;
    }
    prevF = f;
    prevB = b;
  }
}

/** |a/b − 1|, for "the same frequency". */
export const relDiff = (a: number, b: number) => abs(a / b - 1);
