/**
 * Following one tank of a declared coupled pair in a drawn chain, with one evaluation of the
 * chain instead of one per step.
 *
 * The full analysis measures such a tank through coupledExtract (core/extract-resonance.ts):
 * its resonance is the rising zero of the tank's OWN susceptance at its node's frequency, and
 * its Q is (ωr/2G)·dB/dω with B that own susceptance and G the conductance the chain puts at
 * the node (attached: source and downstream sides; detached: the source side only). Only G
 * needs the chain. So the zero is searched for, and dB/dω taken, on the tank's own admittance
 * at the node's frequency (the input frequency carried through any mixer ahead, as the probe
 * carries it), with the same outward steps, the same refinement and the same difference
 * quotient as resonateNear and refineResonance; then the chain is evaluated once, at the
 * zero, for both conductances. The detached search of the full analysis starts at the attached
 * zero and finds the same zero of the same function (to the refinement's 1e-10), so the
 * detached Q uses the attached zero's slope.
 */
import type { BuiltChain } from '../core/build';
import { MIN_NODE_HZ } from '../core/nodes';
import { addInverse, type Probe } from '../core/probe';
import { solveBracketed } from '../core/refine';
import type { ComplexFn } from '../types';

const { PI, max, min } = Math;
const isFiniteNumber = Number.isFinite;

/** Relative step of the central difference for dB/dω (as extract-resonance.ts). */
const DIFF_STEP = 1e-6;

/** What following a coupled tank gives (null: not found or not finite). */
export interface CoupledFollow {
  fIn: number;
  fr: number;
  /** Loaded Q: the node's whole conductance. */
  loadedQ: number | null;
  /** Q with the downstream side cut away (the source side's conductance only). */
  detachedQ: number | null;
}

/**
 * The tank `own` at flat node `flat`, its zero followed from input frequency `near`.
 * @param sign orientation of the node's frequency against the input (trial.ts)
 */
export function followCoupledTank(
  built: BuiltChain,
  probe: Probe,
  flat: number,
  own: ComplexFn,
  near: number,
  sign: number,
): CoupledFollow | null {
  const sections = built.sections;
  const y = new Float64Array(2);
  /** The node's own frequency for input frequency f (the probe's rule). */
  const nodeHz = (f: number) => {
    let x = f;
    for (let j = 0; j < flat; j++) {
      const tr = sections[j].translate;
      if (tr) x = max(tr(x), MIN_NODE_HZ);
    }
    return x;
  };
  const b = (f: number) => {
    own(nodeHz(f), y, 0);
    return y[1];
  };
  const g = (f: number) => sign * b(f);
  const fIn = outwardZero(g, near, 2);
  if (fIn === null) return null;
  const fr = nodeHz(fIn);
  const fLo = nodeHz(fIn * (1 - DIFF_STEP));
  const fHi = nodeHz(fIn * (1 + DIFF_STEP));
  const slope = (b(fIn * (1 + DIFF_STEP)) - b(fIn * (1 - DIFF_STEP))) / (2 * PI * (fHi - fLo));
  probe.at(fIn, flat);
  const gAttached = new Float64Array(2);
  addInverse(probe.zsrcRe[flat], probe.zsrcIm[flat], gAttached);
  const gSource = gAttached[0];
  addInverse(probe.zinRe[flat], probe.zinIm[flat], gAttached);
  const q = (real: number) => {
    const v = ((2 * PI * fr) / (2 * real)) * slope;
    return isFiniteNumber(v) && v > 0 ? v : null;
  };
  return { fIn, fr, loadedQ: q(gAttached[0]), detachedQ: q(gSource) };
}

/**
 * The rising zero of g nearest `near`, stepping outward geometrically up to a factor `span`
 * each way until g changes sign, then refined (resonateNear's steps and refinement).
 */
function outwardZero(g: (f: number) => number, near: number, span: number): number | null {
  const g0 = g(near);
  if (!isFiniteNumber(g0)) return null;
  const up = g0 < 0;
  let prev = near;
  for (let step = 1e-4; ; step *= 2) {
    const ratio = 1 + min(step, span - 1);
    const f = up ? near * ratio : near / ratio;
    const v = g(f);
    if (isFiniteNumber(v) && (up ? v >= 0 : v < 0)) {
      const fIn = up ? solveBracketed(g, prev, f) : solveBracketed(g, f, prev);
      return isFiniteNumber(fIn) ? fIn : null;
    }
    if (!isFiniteNumber(v) || ratio >= span) return null;
    prev = f;
  }
}
