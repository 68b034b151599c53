/**
 * The node analysis's block loop (every node's rows kept): for points i0 … i0+n−1, each
 * section's ABCD, Zin backward from the load, then Zsrc and the voltage forward from the
 * source. A workspace that keeps some rows only runs node-block-kept.ts's loop instead.
 */
import type { BuiltChain } from './build';
import {
  backSeriesSection,
  backShuntSection,
  forwardSeriesSection,
  forwardShuntSection,
} from './ladder-steps';
import { backSection, fillComplex, fillReal, MIN_NODE_HZ } from './node-steps';
import type { NodeAnalysis } from './nodes';

const OPEN = Number.POSITIVE_INFINITY;
const { max } = Math;

/** The node analysis of points i0 … i0+n−1 (n ≤ BLOCK). */
export function runBlock(built: BuiltChain, na: NodeAnalysis, i0: number, n: number): void {
  const P = na.points;
  const N = built.sections.length;
  const { fNode, zinRe, zinIm, zsrcRe, zsrcIm, vRe, vIm, emf, blockAbcd: m, blockPair: t } = na;
  const sections = built.sections;
  const B = m.length / (8 * N || 1);

  // Frequencies at every node and every section's ABCD at the frequency at its input. The
  // input frequencies are copied by a loop: a subarray to copy from would be an object made
  // per block, and a run with a reused workspace allocates nothing.
  const freqs = na.freqs;
  for (let k = i0; k < i0 + n; k++) fNode[k] = freqs[k];
  for (let j = 0; j < N; j++) {
    const s = sections[j];
    const at = j * P + i0;
    // A ladder's section writes its one part's value alone, all its steps below read of it.
    const part = s.ladder ? s.partFill : undefined;
    if (part) part(fNode, at, n, m, 8 * j * B + (s.ladder === 'shunt' ? 4 : 2), 8);
    else s.fill(fNode, at, n, m, 8 * j * B);
    const tr = s.translate;
    // An RF point exactly on the LO translates to 0 Hz, where a series capacitor is an
    // open circuit and its matrix infinite; evaluate such a point at 1 mHz instead.
    if (tr) for (let k = 0; k < n; k++) fNode[at + P + k] = max(tr(fNode[at + k]), MIN_NODE_HZ);
    else fNode.copyWithin(at + P, at, at + n);
  }

  // Backward pass, load → source.
  fillComplex(built.load.model.impedance, fNode, N * P + i0, n, t);
  for (let k = 0; k < n; k++) {
    zinRe[N * P + i0 + k] = t[2 * k];
    zinIm[N * P + i0 + k] = t[2 * k + 1];
  }
  for (let j = N - 1; j >= 0; j--) {
    // A ladder's sections, mostly ones and zeros, have loops of their own (ladder-steps.ts).
    const at = j * P + i0;
    const ladder = sections[j].ladder;
    if (ladder === 'shunt')
      backShuntSection(m, 8 * j * B, zinRe, zinIm, at + P, zinRe, zinIm, at, n); // prettier-ignore
    else if (ladder === 'series')
      backSeriesSection(m, 8 * j * B, zinRe, zinIm, at + P, zinRe, zinIm, at, n); // prettier-ignore
    else backSection(m, 8 * j * B, zinRe, zinIm, at, P, n);
  }

  // Forward pass, source → load, and the voltage at the source terminal.
  const source = built.source.model;
  fillReal(source.emf, na.freqs, i0, n, emf);
  fillComplex(source.impedance, na.freqs, i0, n, t);
  for (let k = 0; k < n; k++) {
    zsrcRe[i0 + k] = t[2 * k];
    zsrcIm[i0 + k] = t[2 * k + 1];
  }
  // Each node's voltages go to its row, or, when it is not kept, to the block's scratch,
  // from where the next section reads them.
  const { vRow } = na;
  // Only a workspace with rows not kept (vRow) has the scratch; others never read it.
  const blockVRe = na.blockVRe ?? vRe;
  const blockVIm = na.blockVIm ?? vIm;
  let row = vRow ? vRow[0] : 0;
  let fromRe = row < 0 ? blockVRe : vRe;
  let fromIm = row < 0 ? blockVIm : vIm;
  let fromAt = row < 0 ? 0 : row * P + i0;
  sourceSection(na, i0, n, fromRe, fromIm, fromAt);
  for (let j = 0; j < N; j++) {
    row = vRow ? vRow[j + 1] : j + 1;
    const toRe = row < 0 ? blockVRe : vRe;
    const toIm = row < 0 ? blockVIm : vIm;
    const toAt = row < 0 ? 0 : row * P + i0;
    const mj = 8 * j * B;
    const at = j * P + i0;
    // A shunt section passes the voltage through (node-steps.ts's `voltageSection`).
    const ladder = sections[j].ladder;
    if (ladder === 'shunt')
      forwardShuntSection(m, mj, zsrcRe, zsrcIm, at, zsrcRe, zsrcIm, at + P, zinRe, zinIm, at + P, n, fromRe, fromIm, fromAt, toRe, toIm, toAt); // prettier-ignore
    else if (ladder === 'series')
      forwardSeriesSection(m, mj, zsrcRe, zsrcIm, zinRe, zinIm, at, P, n, fromRe, fromIm, fromAt, toRe, toIm, toAt); // prettier-ignore
    else forwardSection(m, mj, na, at, P, n, fromRe, fromIm, fromAt, toRe, toIm, toAt);
    fromRe = toRe;
    fromIm = toIm;
    fromAt = toAt;
  }
}

/**
 * The voltage at the source terminal for a block of points into vRe/vIm from `vAt`:
 * {@link sourceStep} written out in one loop (x − x is 0 exactly for finite x).
 */
function sourceSection(
  na: NodeAnalysis,
  i0: number,
  n: number,
  vRe: Float64Array,
  vIm: Float64Array,
  vAt: number,
): void {
  const { emf, zsrcRe, zsrcIm, zinRe, zinIm } = na;
  for (let k = 0; k < n; k++) {
    const i = i0 + k;
    const to = vAt + k;
    const em = emf[i];
    const sr = zsrcRe[i];
    const si = zsrcIm[i];
    const z0r = zinRe[i];
    const z0i = zinIm[i];
    if (!(z0r - z0r === 0) || !(z0i - z0i === 0)) {
      vRe[to] = em;
      vIm[to] = 0;
    } else if (!(sr - sr === 0) || !(si - si === 0)) {
      vRe[to] = 0;
      vIm[to] = 0;
    } else {
      const dr = sr + z0r;
      const di = si + z0i;
      const d2 = dr * dr + di * di;
      vRe[to] = (em * (z0r * dr + z0i * di)) / d2;
      vIm[to] = (em * (z0i * dr - z0r * di)) / d2;
    }
  }
}

/**
 * Zsrc and V at a section's output for a block of points (`at` its input node's first
 * index; its voltages read from vInRe/vInIm at `vIn`, those at its output written to
 * vOutRe/vOutIm at `vOut`, which may be the same places): {@link forwardStep} and
 * {@link voltageStep} written out in one loop, as {@link backSection} is (fused here: the
 * voltage step reads the Zin the same point needs).
 */
function forwardSection(
  m: Float64Array,
  mj: number,
  na: NodeAnalysis,
  at: number,
  P: number,
  n: number,
  vInRe: Float64Array,
  vInIm: Float64Array,
  vIn: number,
  vOutRe: Float64Array,
  vOutIm: Float64Array,
  vOut: number,
): void {
  const { zsrcRe, zsrcIm, zinRe, zinIm } = na;
  for (let k = 0; k < n; k++) {
    const o = mj + 8 * k;
    const from = at + k;
    const to = from + P;
    // Every value the point needs is read first, each once: for all the optimiser knows a
    // store into one of these arrays may change another (the voltages' two places may even
    // be one), so it reads again whatever is read after a store (≈ 5 % of the run).
    const a0 = m[o];
    const a1 = m[o + 1];
    const b0 = m[o + 2];
    const b1 = m[o + 3];
    const c0 = m[o + 4];
    const c1 = m[o + 5];
    const d0 = m[o + 6];
    const d1 = m[o + 7];
    const sr = zsrcRe[from];
    const si = zsrcIm[from];
    const ar = zinRe[to];
    const ai = zinIm[to];
    const vr = vInRe[vIn + k];
    const vi = vInIm[vIn + k];
    // Zsrc at the output: (D·Z + B)/(C·Z + A).
    let nr: number, ni: number, dr: number, di: number; // prettier-ignore
    if (sr - sr === 0 && si - si === 0) {
      nr = d0 * sr - d1 * si + b0;
      ni = d0 * si + d1 * sr + b1;
      dr = c0 * sr - c1 * si + a0;
      di = c0 * si + c1 * sr + a1;
    } else {
      nr = d0;
      ni = d1;
      dr = c0;
      di = c1;
    }
    const d2 = dr * dr + di * di;
    if (d2 === 0) {
      zsrcRe[to] = OPEN;
      zsrcIm[to] = 0;
    } else {
      const inv = 1 / d2;
      zsrcRe[to] = (nr * dr + ni * di) * inv;
      zsrcIm[to] = (ni * dr - nr * di) * inv;
    }
    // V at the output: V/(A + B·Y), Y = 1/Zin(out).
    let er = a0;
    let ei = a1;
    if (ar - ar === 0 && ai - ai === 0) {
      const a2 = ar * ar + ai * ai;
      if (a2 === 0 || (vr === 0 && vi === 0)) {
        vOutRe[vOut + k] = 0;
        vOutIm[vOut + k] = 0;
        continue;
      }
      const ia = 1 / a2;
      const yr = ar * ia;
      const yi = -ai * ia;
      er += b0 * yr - b1 * yi;
      ei += b0 * yi + b1 * yr;
    }
    const ie = 1 / (er * er + ei * ei);
    vOutRe[vOut + k] = (vr * er + vi * ei) * ie;
    vOutIm[vOut + k] = (vi * er - vr * ei) * ie;
  }
}
