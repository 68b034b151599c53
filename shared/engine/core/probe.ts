/**
 * The chain at one frequency, without allocating: what the searches for resonances, band
 * edges and peaks call dozens of times per node after the sweep has bracketed what they look
 * for. The formulas are the node analysis's own (see nodes.ts), kept in the same order so a
 * probe and a sweep agree to rounding.
 *
 * A probe evaluates only what the node asked about needs: the backward pass starts at the
 * first unilateral section at or after the node (whatever lies beyond it cannot change the
 * impedance there), and the forward pass stops at the node.
 */
import type { BuiltChain } from './build';

const finite = Number.isFinite;
const OPEN = Number.POSITIVE_INFINITY;
/** Lowest frequency a section is evaluated at after a mixer, Hz (as in the node analysis). */
const MIN_NODE_HZ = 1e-3;

/** A reusable single-frequency evaluator of one built chain. */
export interface Probe {
  /** Flat nodes (sections + 1). */
  readonly nodes: number;
  /** After a call: frequency at each flat node evaluated, Hz. */
  readonly fNode: Float64Array;
  /** After a call: impedance toward the load / toward the source at each node evaluated. */
  readonly zinRe: Float64Array;
  readonly zinIm: Float64Array;
  readonly zsrcRe: Float64Array;
  readonly zsrcIm: Float64Array;
  /**
   * Evaluates the chain at input frequency f for node `node`: Zin at nodes node…(first
   * unilateral section after it), Zsrc at nodes 0…node. With `voltage`, also Zin at every
   * node before it and returns |V[node]|/|Es| (NaN otherwise).
   */
  at(f: number, node: number, voltage?: boolean): number;
  /** The total admittance at `node` (source and load sides) after `at`: writes G, B. */
  nodeAdmittance(node: number, out: Float64Array): void;
  /**
   * The admittance at `node` with the network cut open at node `cut` (≥ node): the source
   * side plus the sections node…cut−1 ending in an open circuit. Call after `at(f, node)`.
   */
  cutAdmittance(node: number, cut: number, out: Float64Array): void;
}

/** Adds 1/(re + j·im) into out[0], out[1]; an open side adds nothing, a short adds ∞. */
export function addInverse(re: number, im: number, out: Float64Array): void {
  if (!finite(re) || !finite(im)) return;
  const d = re * re + im * im;
  out[0] += d === 0 ? OPEN : re / d;
  out[1] += d === 0 ? 0 : -im / d;
}

/** Makes a probe for a built chain; reuse it for every evaluation of that chain. */
export function createProbe(built: BuiltChain): Probe {
  const sections = built.sections;
  const N = sections.length;
  const fNode = new Float64Array(N + 1);
  const zinRe = new Float64Array(N + 1);
  const zinIm = new Float64Array(N + 1);
  const zsrcRe = new Float64Array(N + 1);
  const zsrcIm = new Float64Array(N + 1);
  const m = new Float64Array(8 * N);
  const t = new Float64Array(2);
  // First unilateral section at or after each node (N when none).
  const stopAt = new Int32Array(N + 1).fill(N);
  for (let j = N - 1; j >= 0; j--) stopAt[j] = sections[j].unilateral ? j : stopAt[j + 1];
  const zl = built.load.model.impedance!;
  const zs = built.source.model.impedance!;
  const es = built.source.model.emf!;

  /** Zin[j] from Zin[j+1] through section j (ABCD already in m). */
  function backward(j: number): void {
    const o = 8 * j;
    const zr = zinRe[j + 1];
    const zi = zinIm[j + 1];
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
      zinRe[j] = OPEN;
      zinIm[j] = 0;
    } else {
      const inv = 1 / d2;
      zinRe[j] = (nr * dr + ni * di) * inv;
      zinIm[j] = (ni * dr - nr * di) * inv;
    }
  }

  /** Zsrc[j+1] from Zsrc[j] through section j. */
  function forward(j: number): void {
    const o = 8 * j;
    const sr = zsrcRe[j];
    const si = zsrcIm[j];
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
      zsrcRe[j + 1] = OPEN;
      zsrcIm[j + 1] = 0;
    } else {
      const inv = 1 / d2;
      zsrcRe[j + 1] = (nr * dr + ni * di) * inv;
      zsrcIm[j + 1] = (ni * dr - nr * di) * inv;
    }
  }

  function at(f: number, node: number, voltage = false): number {
    const last = stopAt[node];
    const end = last < N ? last + 1 : N; // sections 0 … end−1 are needed
    fNode[0] = f;
    for (let j = 0; j < end; j++) {
      const s = sections[j];
      s.abcd(fNode[j], m, 8 * j);
      const tr = s.translate;
      fNode[j + 1] = tr ? Math.max(tr(fNode[j]), MIN_NODE_HZ) : fNode[j];
    }
    if (end === N) {
      zl(fNode[N], t, 0);
      zinRe[N] = t[0];
      zinIm[N] = t[1];
    } else {
      zinRe[end] = OPEN; // beyond a unilateral section: anything gives the same Zin before it
      zinIm[end] = 0;
    }
    const from = voltage ? 0 : node;
    for (let j = end - 1; j >= from; j--) backward(j);
    zs(f, t, 0);
    zsrcRe[0] = t[0];
    zsrcIm[0] = t[1];
    for (let j = 0; j < node; j++) forward(j);
    if (!voltage) return NaN;
    return stepUpTo(f, node);
  }

  /** |V[node]|/|Es| from the voltage divider at node 0 and V[j+1] = V[j]/(A + B/Zin[j+1]). */
  function stepUpTo(f: number, node: number): number {
    const e = es(f);
    const z0r = zinRe[0];
    const z0i = zinIm[0];
    const sr = zsrcRe[0];
    const si = zsrcIm[0];
    let vr: number, vi: number; // prettier-ignore
    if (!finite(z0r) || !finite(z0i)) {
      vr = e;
      vi = 0;
    } else if (!finite(sr) || !finite(si)) {
      return 0;
    } else {
      const dr = sr + z0r;
      const di = si + z0i;
      const d2 = dr * dr + di * di;
      vr = (e * (z0r * dr + z0i * di)) / d2;
      vi = (e * (z0i * dr - z0r * di)) / d2;
    }
    for (let j = 0; j < node; j++) {
      const o = 8 * j;
      const ar = zinRe[j + 1];
      const ai = zinIm[j + 1];
      let er = m[o];
      let ei = m[o + 1];
      if (finite(ar) && finite(ai)) {
        const a2 = ar * ar + ai * ai;
        if (a2 === 0 || (vr === 0 && vi === 0)) return 0;
        const ia = 1 / a2;
        const yr = ar * ia;
        const yi = -ai * ia;
        er += m[o + 2] * yr - m[o + 3] * yi;
        ei += m[o + 2] * yi + m[o + 3] * yr;
      }
      const ie = 1 / (er * er + ei * ei);
      const nr = (vr * er + vi * ei) * ie;
      vi = (vi * er - vr * ei) * ie;
      vr = nr;
    }
    return Math.hypot(vr, vi) / Math.abs(e);
  }

  function nodeAdmittance(node: number, out: Float64Array): void {
    out[0] = 0;
    out[1] = 0;
    addInverse(zsrcRe[node], zsrcIm[node], out);
    addInverse(zinRe[node], zinIm[node], out);
  }

  // Scratch for the cut-open backward pass (kept apart from the probe's own Zin).
  const cutRe = new Float64Array(N + 1);
  const cutIm = new Float64Array(N + 1);
  function cutAdmittance(node: number, cut: number, out: Float64Array): void {
    out[0] = 0;
    out[1] = 0;
    addInverse(zsrcRe[node], zsrcIm[node], out);
    if (cut <= node) return;
    cutRe[cut] = OPEN;
    cutIm[cut] = 0;
    for (let j = cut - 1; j >= node; j--) {
      const o = 8 * j;
      // Open at the cut: Zin = A/C, then the usual bilinear step.
      const zr = cutRe[j + 1];
      const zi = cutIm[j + 1];
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
        cutRe[j] = OPEN;
        cutIm[j] = 0;
      } else {
        cutRe[j] = (nr * dr + ni * di) / d2;
        cutIm[j] = (ni * dr - nr * di) / d2;
      }
    }
    addInverse(cutRe[node], cutIm[node], out);
  }

  return { nodes: N + 1, fNode, zinRe, zinIm, zsrcRe, zsrcIm, at, nodeAdmittance, cutAdmittance }; // prettier-ignore
}
