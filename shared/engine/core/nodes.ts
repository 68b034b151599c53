/**
 * Node analysis of a built chain over a frequency array (the hot path).
 *
 * Flat nodes 0 … N for N sections: node 0 is the source terminal, node N the load terminal,
 * section j sits between node j and node j+1. Every quantity is one Float64Array indexed
 * `node·points + i` (point i of the input frequency array). No objects are made per point.
 *
 * - Backward pass: Zin[N] = ZL, Zin[j] = (A·Zin[j+1] + B)/(C·Zin[j+1] + D). An open node
 *   (ZL = ∞) is carried as a non-finite value and gives Zin[j] = A/C.
 * - Forward pass: Zsrc[0] = Zs, Zsrc[j+1] = (D·Zsrc[j] + B)/(C·Zsrc[j] + A).
 * - Voltages (PEAK phasors): V[0] = Es·Zin[0]/(Zs + Zin[0]), V[j+1] = V[j]/(A + B/Zin[j+1]).
 * A unilateral section (y12 = 0) has AD − BC = 0, so the backward pass gives 1/y11 at its
 * input whatever lies beyond it, and the forward pass 1/y22 at its output: the restart falls
 * out of the matrices. Each section is evaluated at the frequency at its input; `translate`
 * gives the frequency at its output (mixers).
 */
import type { BuiltChain } from './build';

/** Results of a node analysis. Arrays are `nodes × points`, index `node·points + i`. */
export interface NodeAnalysis {
  points: number;
  /** Flat nodes (sections + 1). */
  nodes: number;
  /** Input (source-side) frequencies, Hz. */
  freqs: Float64Array;
  /** Frequency at each node for each input frequency, Hz. */
  fNode: Float64Array;
  /** Impedance looking toward the load (non-finite = open). */
  zinRe: Float64Array;
  zinIm: Float64Array;
  /** Impedance looking back toward the source. */
  zsrcRe: Float64Array;
  zsrcIm: Float64Array;
  /** Node voltage, PEAK phasor, volts. */
  vRe: Float64Array;
  vIm: Float64Array;
  /** Source EMF (PEAK volts) at each input frequency. */
  emf: Float64Array;
  /** Scratch: the ABCD of every section at the current point (8 slots each). */
  readonly scratch: Float64Array;
}

/** Allocates a workspace for `points` frequencies; pass it back to reuse the arrays. */
export function createNodeAnalysis(built: BuiltChain, points: number): NodeAnalysis {
  const nodes = built.sections.length + 1;
  const size = nodes * points;
  return {
    points,
    nodes,
    freqs: new Float64Array(points),
    fNode: new Float64Array(size),
    zinRe: new Float64Array(size),
    zinIm: new Float64Array(size),
    zsrcRe: new Float64Array(size),
    zsrcIm: new Float64Array(size),
    vRe: new Float64Array(size),
    vIm: new Float64Array(size),
    emf: new Float64Array(points),
    scratch: new Float64Array(8 * Math.max(1, built.sections.length) + 2),
  };
}

/**
 * Runs the node analysis at every frequency of `freqs` (Hz at the chain's input).
 * @param ws a workspace from {@link createNodeAnalysis} with the same point count to reuse
 */
export function runNodeAnalysis(
  built: BuiltChain,
  freqs: ArrayLike<number>,
  ws?: NodeAnalysis,
): NodeAnalysis {
  const P = freqs.length;
  const na = ws && ws.points === P && ws.nodes === built.sections.length + 1
    ? ws
    : createNodeAnalysis(built, P); // prettier-ignore
  const { fNode, zinRe, zinIm, zsrcRe, zsrcIm, vRe, vIm, emf, scratch: m } = na;
  const sections = built.sections;
  const N = sections.length;
  const zl = built.load.model.impedance!;
  const zs = built.source.model.impedance!;
  const es = built.source.model.emf!;
  const zo = 8 * N; // two scratch slots after the matrices

  for (let i = 0; i < P; i++) {
    const f = freqs[i];
    na.freqs[i] = f;
    fNode[i] = f;
    for (let j = 0; j < N; j++) {
      const fj = fNode[j * P + i];
      const s = sections[j];
      s.abcd(fj, m, 8 * j);
      fNode[(j + 1) * P + i] = s.translate ? s.translate(fj) : fj;
    }

    // Backward pass, load → source.
    zl(fNode[N * P + i], m, zo);
    let zr = m[zo];
    let zi = m[zo + 1];
    zinRe[N * P + i] = zr;
    zinIm[N * P + i] = zi;
    for (let j = N - 1; j >= 0; j--) {
      const o = 8 * j;
      let nr: number, ni: number, dr: number, di: number; // prettier-ignore
      if (Number.isFinite(zr) && Number.isFinite(zi)) {
        nr = m[o] * zr - m[o + 1] * zi + m[o + 2];
        ni = m[o] * zi + m[o + 1] * zr + m[o + 3];
        dr = m[o + 4] * zr - m[o + 5] * zi + m[o + 6];
        di = m[o + 4] * zi + m[o + 5] * zr + m[o + 7];
      } else {
        nr = m[o];
        ni = m[o + 1];
        dr = m[o + 4];
        di = m[o + 5];
      }
      const d2 = dr * dr + di * di;
      if (d2 === 0) {
        zr = Infinity;
        zi = 0;
      } else {
        zr = (nr * dr + ni * di) / d2;
        zi = (ni * dr - nr * di) / d2;
      }
      zinRe[j * P + i] = zr;
      zinIm[j * P + i] = zi;
    }

    // Forward pass, source → load.
    zs(f, m, zo);
    let sr = m[zo];
    let si = m[zo + 1];
    const zsr = sr;
    const zsi = si;
    zsrcRe[i] = sr;
    zsrcIm[i] = si;
    for (let j = 0; j < N; j++) {
      const o = 8 * j;
      let nr: number, ni: number, dr: number, di: number; // prettier-ignore
      if (Number.isFinite(sr) && Number.isFinite(si)) {
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
        sr = Infinity;
        si = 0;
      } else {
        sr = (nr * dr + ni * di) / d2;
        si = (ni * dr - nr * di) / d2;
      }
      zsrcRe[(j + 1) * P + i] = sr;
      zsrcIm[(j + 1) * P + i] = si;
    }

    // Node voltages, PEAK phasors.
    const e = es(f);
    emf[i] = e;
    let vr: number, vi: number; // prettier-ignore
    const z0r = zinRe[i];
    const z0i = zinIm[i];
    if (!Number.isFinite(z0r) || !Number.isFinite(z0i)) {
      vr = e;
      vi = 0;
    } else if (!Number.isFinite(zsr) || !Number.isFinite(zsi)) {
      vr = 0;
      vi = 0;
    } else {
      // V0 = e·Zin/(Zs + Zin)
      const dr = zsr + z0r;
      const di = zsi + z0i;
      const d2 = dr * dr + di * di;
      vr = (e * (z0r * dr + z0i * di)) / d2;
      vi = (e * (z0i * dr - z0r * di)) / d2;
    }
    vRe[i] = vr;
    vIm[i] = vi;
    for (let j = 0; j < N; j++) {
      const o = 8 * j;
      const k = (j + 1) * P + i;
      const ar = zinRe[k];
      const ai = zinIm[k];
      // den = A + B·Y with Y = 1/Zin[j+1] (0 when open)
      let dr = m[o];
      let di = m[o + 1];
      if (Number.isFinite(ar) && Number.isFinite(ai)) {
        const a2 = ar * ar + ai * ai;
        if (a2 === 0) {
          vr = 0; // a short: no voltage from here on
          vi = 0;
          vRe[k] = 0;
          vIm[k] = 0;
          continue;
        }
        const yr = ar / a2;
        const yi = -ai / a2;
        dr += m[o + 2] * yr - m[o + 3] * yi;
        di += m[o + 2] * yi + m[o + 3] * yr;
      }
      const d2 = dr * dr + di * di;
      const nr = (vr * dr + vi * di) / d2;
      const ni = (vi * dr - vr * di) / d2;
      vr = nr;
      vi = ni;
      vRe[k] = vr;
      vIm[k] = vi;
    }
  }
  return na;
}
