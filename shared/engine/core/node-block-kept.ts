/**
 * The node analysis's block loop for a workspace that keeps some nodes' rows only (a long
 * sweep: see `impedanceAt` / `voltageAt` in nodes.ts). The rows not kept go to a block-sized
 * scratch. Its own loop, not a branch in nodes.ts's: the scratch's indirection costs about
 * 5 % more per point, which a sweep that keeps every row should not pay.
 */
import type { BuiltChain } from './build';
import { backShuntSection, forwardShuntSection } from './ladder-steps';
import { fillComplex, fillReal, MIN_NODE_HZ, voltageSection } from './node-steps';
import type { NodeAnalysis } from './nodes';

const OPEN = Number.POSITIVE_INFINITY;
const { max } = Math;

/**
 * The node analysis of points i0 … i0+n−1 (n ≤ BLOCK). Each node's frequency, impedances and
 * voltages go to its rows, or, in a workspace that does not keep that node's (zRow, vRow), to
 * the block's scratch: the frequency, Zsrc and the voltage to one row that the next node's
 * values overwrite, Zin (which the forward pass reads again) to that node's row of the
 * scratch. The same loops over other places, so the same numbers.
 */
export function runBlockKept(built: BuiltChain, na: NodeAnalysis, i0: number, n: number): void {
  const P = na.points;
  const N = built.sections.length;
  const { fNode, zinRe, zinIm, zsrcRe, zsrcIm, vRe, vIm, emf, blockAbcd: m, blockPair: t } = na;
  const { zRow, vRow } = na;
  const sections = built.sections;
  const B = m.length / (8 * N || 1);
  // Only a workspace with rows not kept has the scratch; others never read it.
  const bF = na.blockF ?? fNode;
  const bZr = na.blockZinRe ?? zinRe;
  const bZi = na.blockZinIm ?? zinIm;
  const bSr = na.blockZsrcRe ?? zsrcRe;
  const bSi = na.blockZsrcIm ?? zsrcIm;

  // Frequencies at every node and every section's ABCD at the frequency at its input. The
  // input frequencies are copied by a loop: a subarray to copy from would be an object made
  // per block, and a run with a reused workspace allocates nothing.
  const freqs = na.freqs;
  let row = zRow ? zRow[0] : 0;
  let fAt = row < 0 ? 0 : row * P + i0;
  let fFrom = row < 0 ? bF : fNode;
  for (let k = 0; k < n; k++) fFrom[fAt + k] = freqs[i0 + k];
  for (let j = 0; j < N; j++) {
    const s = sections[j];
    // A shunt section writes its admittance alone, all its steps below read of it (as in
    // node-block.ts).
    const part = s.ladder === 'shunt' ? s.partFill : undefined;
    if (part) part(fFrom, fAt, n, m, 8 * j * B + 4, 8);
    else s.fill(fFrom, fAt, n, m, 8 * j * B);
    row = zRow ? zRow[j + 1] : j + 1;
    const to = row < 0 ? bF : fNode;
    const toAt = row < 0 ? 0 : row * P + i0;
    const tr = s.translate;
    // An RF point exactly on the LO translates to 0 Hz, where a series capacitor is an
    // open circuit and its matrix infinite; evaluate such a point at 1 mHz instead.
    if (tr) for (let k = 0; k < n; k++) to[toAt + k] = max(tr(fFrom[fAt + k]), MIN_NODE_HZ);
    else if (to === fFrom) {
      if (toAt !== fAt) to.copyWithin(toAt, fAt, fAt + n);
    } else for (let k = 0; k < n; k++) to[toAt + k] = fFrom[fAt + k];
    fFrom = to;
    fAt = toAt;
  }

  // Backward pass, load → source (the load at the frequency of node N, where fFrom is now).
  fillComplex(built.load.model.impedance, fFrom, fAt, n, t);
  row = zRow ? zRow[N] : N;
  let zInRe = row < 0 ? bZr : zinRe;
  let zInIm = row < 0 ? bZi : zinIm;
  let zAt = row < 0 ? N * B : row * P + i0;
  for (let k = 0; k < n; k++) {
    zInRe[zAt + k] = t[2 * k];
    zInIm[zAt + k] = t[2 * k + 1];
  }
  for (let j = N - 1; j >= 0; j--) {
    row = zRow ? zRow[j] : j;
    const toRe = row < 0 ? bZr : zinRe;
    const toIm = row < 0 ? bZi : zinIm;
    const toAt = row < 0 ? j * B : row * P + i0;
    if (sections[j].ladder === 'shunt')
      backShuntSection(m, 8 * j * B, zInRe, zInIm, zAt, toRe, toIm, toAt, n);
    else backSectionTo(m, 8 * j * B, zInRe, zInIm, zAt, toRe, toIm, toAt, n);
    zInRe = toRe;
    zInIm = toIm;
    zAt = toAt;
  }

  // Forward pass, source → load, and the voltage at the source terminal.
  const source = built.source.model;
  fillReal(source.emf, na.freqs, i0, n, emf);
  fillComplex(source.impedance, na.freqs, i0, n, t);
  row = zRow ? zRow[0] : 0;
  let sRe = row < 0 ? bSr : zsrcRe;
  let sIm = row < 0 ? bSi : zsrcIm;
  let sAt = row < 0 ? 0 : row * P + i0;
  for (let k = 0; k < n; k++) {
    sRe[sAt + k] = t[2 * k];
    sIm[sAt + k] = t[2 * k + 1];
  }
  // Each node's voltages go to its row, or, when it is not kept, to the block's scratch,
  // from where the next section reads them.
  const blockVRe = na.blockVRe ?? vRe;
  const blockVIm = na.blockVIm ?? vIm;
  let vr = vRow ? vRow[0] : 0;
  let fromRe = vr < 0 ? blockVRe : vRe;
  let fromIm = vr < 0 ? blockVIm : vIm;
  let fromAt = vr < 0 ? 0 : vr * P + i0;
  // zInRe/zInIm/zAt are node 0's Zin now.
  sourceSectionKept(emf, i0, sRe, sIm, sAt, zInRe, zInIm, zAt, n, fromRe, fromIm, fromAt);
  // Zsrc is carried forward only as far as the last node whose impedances are kept: past it
  // nothing reads it (a node's voltage needs the Zin at its output, not Zsrc), so the sections
  // after it take the voltage step alone. (The sweep alone keeps node 0's only.)
  const zsrcTo = lastKeptNode(zRow, N);
  for (let j = 0; j < N; j++) {
    vr = vRow ? vRow[j + 1] : j + 1;
    const toRe = vr < 0 ? blockVRe : vRe;
    const toIm = vr < 0 ? blockVIm : vIm;
    const toAt = vr < 0 ? 0 : vr * P + i0;
    row = zRow ? zRow[j + 1] : j + 1;
    const zOutRe = row < 0 ? bZr : zinRe;
    const zOutIm = row < 0 ? bZi : zinIm;
    const zOutAt = row < 0 ? (j + 1) * B : row * P + i0;
    const mj = 8 * j * B;
    const shunt = sections[j].ladder === 'shunt';
    if (j >= zsrcTo) {
      voltageSection(m, mj, zOutRe, zOutIm, zOutAt, n, fromRe, fromIm, fromAt, toRe, toIm, toAt, shunt); // prettier-ignore
      fromRe = toRe;
      fromIm = toIm;
      fromAt = toAt;
      continue;
    }
    const sToRe = row < 0 ? bSr : zsrcRe;
    const sToIm = row < 0 ? bSi : zsrcIm;
    const sToAt = row < 0 ? 0 : row * P + i0;
    // A shunt section passes the voltage through, as in node-block.ts.
    if (shunt) forwardShuntSection(m, mj, sRe, sIm, sAt, sToRe, sToIm, sToAt, zOutRe, zOutIm, zOutAt, n, fromRe, fromIm, fromAt, toRe, toIm, toAt); // prettier-ignore
    else forwardSectionKept(m, mj, sRe, sIm, sAt, sToRe, sToIm, sToAt, zOutRe, zOutIm, zOutAt, n, fromRe, fromIm, fromAt, toRe, toIm, toAt); // prettier-ignore
    sRe = sToRe;
    sIm = sToIm;
    sAt = sToAt;
    fromRe = toRe;
    fromIm = toIm;
    fromAt = toAt;
  }
}

/** The last flat node (0…N) whose impedances a row map keeps (N without a map). */
function lastKeptNode(zRow: Int32Array | undefined, N: number): number {
  if (!zRow) return N;
  let last = 0;
  for (let j = 0; j <= N; j++) if (zRow[j] >= 0) last = j;
  return last;
}

/**
 * Zin at a section's input for a block of points, from Zin at its output (read from inRe/inIm
 * at `inAt`, written to outRe/outIm at `outAt`): node-steps.ts's `backSection` between any two places.
 */
function backSectionTo(
  m: Float64Array,
  mj: number,
  inRe: Float64Array,
  inIm: Float64Array,
  inAt: number,
  outRe: Float64Array,
  outIm: Float64Array,
  outAt: number,
  n: number,
): void {
  for (let k = 0; k < n; k++) {
    const o = mj + 8 * k;
    const zr = inRe[inAt + k];
    const zi = inIm[inAt + k];
    // Every value read before the first store (see forwardSection).
    const a0 = m[o];
    const a1 = m[o + 1];
    const b0 = m[o + 2];
    const b1 = m[o + 3];
    const c0 = m[o + 4];
    const c1 = m[o + 5];
    const d0 = m[o + 6];
    const d1 = m[o + 7];
    let nr: number, ni: number, dr: number, di: number; // prettier-ignore
    if (zr - zr === 0 && zi - zi === 0) {
      nr = a0 * zr - a1 * zi + b0;
      ni = a0 * zi + a1 * zr + b1;
      dr = c0 * zr - c1 * zi + d0;
      di = c0 * zi + c1 * zr + d1;
    } else {
      nr = a0;
      ni = a1;
      dr = c0;
      di = c1;
    }
    const d2 = dr * dr + di * di;
    if (d2 === 0) {
      outRe[outAt + k] = OPEN;
      outIm[outAt + k] = 0;
    } else {
      const inv = 1 / d2; // one division, two products
      outRe[outAt + k] = (nr * dr + ni * di) * inv;
      outIm[outAt + k] = (ni * dr - nr * di) * inv;
    }
  }
}

/**
 * The voltage at the source terminal for a block of points into vRe/vIm from `vAt`:
 * node-steps.ts's `sourceStep` written out in one loop (x − x is 0 exactly for finite x). The EMF is
 * read from point i0, Zsrc and Zin at node 0 from `sAt` and `zAt`.
 */
function sourceSectionKept(
  emf: Float64Array,
  i0: number,
  zsrcRe: Float64Array,
  zsrcIm: Float64Array,
  sAt: number,
  zinRe: Float64Array,
  zinIm: Float64Array,
  zAt: number,
  n: number,
  vRe: Float64Array,
  vIm: Float64Array,
  vAt: number,
): void {
  for (let k = 0; k < n; k++) {
    const to = vAt + k;
    const em = emf[i0 + k];
    const sr = zsrcRe[sAt + k];
    const si = zsrcIm[sAt + k];
    const z0r = zinRe[zAt + k];
    const z0i = zinIm[zAt + k];
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
 * Zsrc and V at a section's output for a block of points (Zsrc at its input read from
 * sInRe/sInIm at `sIn` and at its output written to sOutRe/sOutIm at `sOut`, Zin at its
 * output read from zRe/zIm at `zAt`, its voltages read from vInRe/vInIm at `vIn` and those
 * at its output written to vOutRe/vOutIm at `vOut`; the places read and written may be the
 * same): {@link forwardStep} and
 * node-steps.ts's `voltageStep` written out in one loop, as node-steps.ts's `backSection` is (fused here: the
 * voltage step reads the Zin the same point needs).
 */
function forwardSectionKept(
  m: Float64Array,
  mj: number,
  sInRe: Float64Array,
  sInIm: Float64Array,
  sIn: number,
  sOutRe: Float64Array,
  sOutIm: Float64Array,
  sOut: number,
  zRe: Float64Array,
  zIm: Float64Array,
  zAt: number,
  n: number,
  vInRe: Float64Array,
  vInIm: Float64Array,
  vIn: number,
  vOutRe: Float64Array,
  vOutIm: Float64Array,
  vOut: number,
): void {
  for (let k = 0; k < n; k++) {
    const o = mj + 8 * k;
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
    const sr = sInRe[sIn + k];
    const si = sInIm[sIn + k];
    const ar = zRe[zAt + k];
    const ai = zIm[zAt + k];
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
      sOutRe[sOut + k] = OPEN;
      sOutIm[sOut + k] = 0;
    } else {
      const inv = 1 / d2;
      sOutRe[sOut + k] = (nr * dr + ni * di) * inv;
      sOutIm[sOut + k] = (ni * dr - nr * di) * inv;
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
