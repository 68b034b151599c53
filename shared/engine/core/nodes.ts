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

// Globals read once: inside some hosts (test runners' VM contexts) each global lookup in a
// hot loop is slow.
const finite = Number.isFinite;
const OPEN = Number.POSITIVE_INFINITY;

/** Lowest frequency a section is evaluated at after a mixer, Hz. */
const MIN_NODE_HZ = 1e-3;

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
  /** The ABCD of every section at every point, 8 slots each, at offset 8·(section·points + i). */
  abcd: Float64Array;
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
    abcd: new Float64Array(8 * built.sections.length * points),
  };
}

/**
 * Runs the node analysis at every frequency of `freqs` (Hz at the chain's input).
 * Loops run section by section over all points so memory is read in order.
 * @param ws a workspace from {@link createNodeAnalysis} with the same point count to reuse
 */
export function runNodeAnalysis(
  built: BuiltChain,
  freqs: ArrayLike<number>,
  ws?: NodeAnalysis,
): NodeAnalysis {
  const P = freqs.length;
  const N = built.sections.length;
  const na = ws && ws.points === P && ws.nodes === N + 1 ? ws : createNodeAnalysis(built, P);
  const { fNode, zinRe, zinIm, zsrcRe, zsrcIm, vRe, vIm, emf, abcd: m } = na;
  const sections = built.sections;
  const t = new Float64Array(2);

  // Frequencies at every node and every section's ABCD at the frequency at its input.
  for (let i = 0; i < P; i++) {
    na.freqs[i] = freqs[i];
    fNode[i] = freqs[i];
  }
  for (let j = 0; j < N; j++) {
    const s = sections[j];
    const tr = s.translate;
    const base = j * P;
    for (let i = 0; i < P; i++) {
      const fj = fNode[base + i];
      s.abcd(fj, m, 8 * (base + i));
      // An RF point exactly on the LO translates to 0 Hz, where a series capacitor is an
      // open circuit and its matrix infinite; evaluate such a point at 1 mHz instead.
      fNode[base + P + i] = tr ? Math.max(tr(fj), MIN_NODE_HZ) : fj;
    }
  }

  // Backward pass, load → source.
  const zl = built.load.model.impedance;
  for (let i = 0; i < P; i++) {
    zl(fNode[N * P + i], t, 0);
    zinRe[N * P + i] = t[0];
    zinIm[N * P + i] = t[1];
  }
  for (let j = N - 1; j >= 0; j--) {
    const out = j * P;
    for (let i = 0; i < P; i++) {
      const o = 8 * (out + i);
      const zr = zinRe[out + P + i];
      const zi = zinIm[out + P + i];
      let nr: number, ni: number, dr: number, di: number; // prettier-ignore
      if (finite(zr) && finite(zi)) {
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
        zinRe[out + i] = OPEN;
        zinIm[out + i] = 0;
      } else {
        const inv = 1 / d2; // one division, two products
        zinRe[out + i] = (nr * dr + ni * di) * inv;
        zinIm[out + i] = (ni * dr - nr * di) * inv;
      }
    }
  }

  // Forward pass, source → load, and the voltage at the source terminal.
  const zs = built.source.model.impedance;
  const es = built.source.model.emf;
  for (let i = 0; i < P; i++) {
    zs(freqs[i], t, 0);
    const sr = t[0];
    const si = t[1];
    zsrcRe[i] = sr;
    zsrcIm[i] = si;
    const e = es(freqs[i]);
    emf[i] = e;
    const z0r = zinRe[i];
    const z0i = zinIm[i];
    if (!finite(z0r) || !finite(z0i)) {
      vRe[i] = e;
      vIm[i] = 0;
    } else if (!finite(sr) || !finite(si)) {
      vRe[i] = 0;
      vIm[i] = 0;
    } else {
      // V0 = e·Zin/(Zs + Zin)
      const dr = sr + z0r;
      const di = si + z0i;
      const d2 = dr * dr + di * di;
      vRe[i] = (e * (z0r * dr + z0i * di)) / d2;
      vIm[i] = (e * (z0i * dr - z0r * di)) / d2;
    }
  }
  for (let j = 0; j < N; j++) {
    const at = j * P;
    for (let i = 0; i < P; i++) {
      const o = 8 * (at + i);
      const sr = zsrcRe[at + i];
      const si = zsrcIm[at + i];
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
      const k = at + P + i;
      if (d2 === 0) {
        zsrcRe[k] = OPEN;
        zsrcIm[k] = 0;
      } else {
        const inv = 1 / d2;
        zsrcRe[k] = (nr * dr + ni * di) * inv;
        zsrcIm[k] = (ni * dr - nr * di) * inv;
      }

      // V[j+1] = V[j]/(A + B·Y) with Y = 1/Zin[j+1] (0 when open, a short gives 0 V)
      const ar = zinRe[k];
      const ai = zinIm[k];
      const vr = vRe[at + i];
      const vi = vIm[at + i];
      let er = m[o];
      let ei = m[o + 1];
      if (finite(ar) && finite(ai)) {
        const a2 = ar * ar + ai * ai;
        if (a2 === 0 || (vr === 0 && vi === 0)) {
          vRe[k] = 0;
          vIm[k] = 0;
          continue;
        }
        const ia = 1 / a2;
        const yr = ar * ia;
        const yi = -ai * ia;
        er += m[o + 2] * yr - m[o + 3] * yi;
        ei += m[o + 2] * yi + m[o + 3] * yr;
      }
      const ie = 1 / (er * er + ei * ei);
      vRe[k] = (vr * er + vi * ei) * ie;
      vIm[k] = (vi * er - vr * ei) * ie;
    }
  }
  return na;
}
