/**
 * Following a shunt tuned circuit in a drawn chain with fewer evaluations of the chain.
 *
 * The full analysis and resonanceNear (core/resonance-search.ts) step outward from a known
 * frequency by 1e-4, 2e-4, 4e-4 … until the susceptance changes sign, then refine the zero on
 * the last step (Illinois, to 1e-10). A trial's resonance sits a few per cent from the nominal
 * one: some eight steps and a wide last bracket. Near a resonance B(f) is close to a straight
 * line, so after the first step the zero is predicted from the two values (a secant), and
 * two points 5 % of the predicted distance either side of it are tried: when they bracket the
 * zero, the refinement starts from that narrow bracket. When they do not (the prediction was
 * off, or the zero lies beyond the first point), the geometric steps carry on as before. The
 * zero, Q and loading ratio are those resonanceNear and shuntFigures give, to the refinement's
 * tolerance (test/engine/studies-trial.test.ts).
 */
import type { BuiltChain } from '../core/build';
import type { Probe } from '../core/probe';
import {
  attached,
  cutAt,
  resonanceNear,
  type AdmittanceOf,
  type NodeResonance,
  type ZeroGuess,
} from '../core/resonance-search';
import { detachCut, type Topology } from '../core/topology';

const { abs } = Math;
const isFiniteNumber = Number.isFinite;
/** How far either side of a predicted zero the bracket is tried, as a share of the jump. */
const AROUND = 0.05;

/**
 * After the first step the zero is predicted by the secant through the two values, and two
 * points 5 % of the predicted jump either side of it are tried: the zero when they bracket
 * it; undefined (step on) when they do not.
 */
const predictBySecant: ZeroGuess = ({ near, up, prevF, prevB, f, b, span, bAt, past, solve }) => {
  const zero = f - (b * (f - prevF)) / (b - prevB);
  const jump = zero - f;
  const ahead = up ? jump > 0 : jump < 0;
  if (!ahead || !isFiniteNumber(zero) || abs(zero / near - 1) >= span - 1) return undefined;
  const under = zero - AROUND * jump;
  const over = zero + AROUND * jump;
  const bOver = bAt(over);
  if (!past(bOver)) return undefined;
  const bUnder = bAt(under);
  if (past(bUnder)) return solve(f, under, b, bUnder);
  if (isFiniteNumber(bUnder)) return solve(under, over, bUnder, bOver);
  return undefined;
};

/**
 * The rising zero of B nearest `near` (input Hz), as resonanceNear finds it, measured at
 * `node` with the admittance `y`; null when none within a factor `span`.
 */
export function resonanceNearPredicted(
  probe: Probe,
  node: number,
  near: number,
  sign: number,
  y: AdmittanceOf,
  scratch: Float64Array,
  span = 2,
): NodeResonance | null {
  return resonanceNear(probe, node, near, sign, y, scratch, span, predictBySecant);
}

/** What following a shunt tuned circuit gives. */
export interface ShuntFollow {
  fIn: number;
  fr: number;
  loadedQ: number | null;
  loadingRatio: number | null;
}

const nn = (x: number) => (Number.isNaN(x) ? null : x);

/**
 * A shunt tuned circuit at flat node `flat` followed from input frequency `near`: its loaded
 * resonance and Q, and the loading ratio against its detached Q (shunt-tank.ts's rule).
 */
export function followShunt(
  built: BuiltChain,
  topo: Topology,
  probe: Probe,
  flat: number,
  near: number,
  sign: number,
): ShuntFollow | null {
  const scratch = new Float64Array(2);
  const att = resonanceNearPredicted(probe, flat, near, sign, attached, scratch);
  if (!att) return null;
  const cut = detachCut(built, topo, flat, att.fr);
  const det = resonanceNearPredicted(probe, flat, att.fIn, att.sign, cutAt(cut), scratch);
  const qA = nn(att.q);
  const qD = det ? nn(det.q) : null;
  return { fIn: att.fIn, fr: att.fr, loadedQ: qA, loadingRatio: qA && qD ? qA / qD : null };
}
