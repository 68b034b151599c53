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
 *
 * The points are taken in blocks of {@link BLOCK}: each section's matrices for a block are
 * written by its block form (`Section.fill`, one monomorphic loop, nothing boxed) into a
 * small scratch that stays in cache while the backward and forward passes read it. Memory
 * therefore grows with nodes × points for the results only, not with sections × points for
 * the matrices. With a reused workspace a run allocates nothing. The per-point steps are
 * written out in the block loops (node-steps.ts keeps them for single points): in a cold
 * process, as the CLI's one analysis runs, an interpreted call per point costs more than
 * its arithmetic.
 */
import type { AbcdFill, ComplexFn, RealFn } from '../types';
import type { BuiltChain } from './build';
import { backSection } from './node-steps';

export { backSection, backStep, forwardStep, sourceStep, voltageStep } from './node-steps';

// Globals read once: inside some hosts (test runners' VM contexts) each global lookup in a
// hot loop is slow.
const OPEN = Number.POSITIVE_INFINITY;
const { max } = Math;

/** Lowest frequency a section is evaluated at after a mixer, Hz. */
export const MIN_NODE_HZ = 1e-3;

/** Points per block: the sections' matrices for one block fit in the processor's cache. */
export const BLOCK = 256;

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
  /**
   * Node voltage, PEAK phasor, volts, index `node·points + i`; in a workspace made with
   * `voltageAt`, index `vRow[node]·points + i` instead.
   */
  vRe: Float64Array;
  vIm: Float64Array;
  /**
   * Row of each node's voltage in vRe/vIm, −1 for a node whose voltage is not kept; absent
   * when every node has its row (row = node).
   */
  vRow?: Int32Array;
  /** Source EMF (PEAK volts) at each input frequency. */
  emf: Float64Array;
  /** Scratch of the run: every section's ABCD for one block of points (8 slots each). */
  blockAbcd: Float64Array;
  /** Scratch of the run: one block of complex values (re, im interleaved). */
  blockPair: Float64Array;
  /** Scratch of the run: one block of voltages at a node whose row is not kept (re, im). */
  blockVRe?: Float64Array;
  blockVIm?: Float64Array;
  /**
   * Row of each node's frequency and impedances in fNode, zinRe/zinIm and zsrcRe/zsrcIm, −1
   * for a node whose are not kept; absent when every node has its row (row = node).
   */
  zRow?: Int32Array;
  /**
   * Scratch of the run with `zRow`: one block of the frequency and Zsrc at a node whose are
   * not kept, and of every such node's Zin (index `node·BLOCK + k`).
   */
  blockF?: Float64Array;
  blockZinRe?: Float64Array;
  blockZinIm?: Float64Array;
  blockZsrcRe?: Float64Array;
  blockZsrcIm?: Float64Array;
}

/** What a workspace keeps beyond what every analysis needs. */
export interface NodeAnalysisOptions {
  /**
   * The flat nodes whose voltages are kept (default: every node). The voltage is still
   * carried through every node, the same numbers as without the option, but only these
   * nodes' rows are stored, in ascending node order (`vRow` says where): a long sweep whose
   * reader needs the voltage at a few nodes does not write, nor hold, it at every other.
   */
  voltageAt?: ArrayLike<number>;
  /**
   * The flat nodes whose frequency (fNode) and impedances (Zin, Zsrc) are kept (default:
   * every node). They are still worked out at every node, the same numbers as without the
   * option, in a scratch of one block of points, but only these nodes' rows are stored, in
   * ascending node order (`zRow` says where; read them through {@link impedanceRow}).
   */
  impedanceAt?: ArrayLike<number>;
}

/** Each node's row: the nodes listed, in ascending order, once each. */
function voltageRows(nodes: number, voltageAt: ArrayLike<number>, name = 'voltageAt'): Int32Array {
  const row = new Int32Array(nodes).fill(-1);
  for (let k = 0; k < voltageAt.length; k++) {
    const n = voltageAt[k];
    if (!Number.isInteger(n) || n < 0 || n >= nodes) {
      throw new RangeError(`${name}: ${n} is not a node of this chain (0 … ${nodes - 1})`);
    }
    row[n] = 0;
  }
  let next = 0;
  for (let n = 0; n < nodes; n++) if (row[n] === 0) row[n] = next++;
  return row;
}

/**
 * The row of `node`'s voltage in `na.vRe`/`na.vIm` (index `row·points + i`): the node itself
 * in a workspace that keeps every node's, else its kept row.
 * @throws RangeError when the workspace does not keep that node's voltage
 */
export function voltageRow(na: NodeAnalysis, node: number): number {
  const { vRow } = na;
  if (!vRow) return node;
  const row = vRow[node];
  if (!(row >= 0)) throw new RangeError(`node ${node}'s voltage is not kept in this node analysis`);
  return row;
}

/**
 * The row of `node`'s frequency and impedances in `na.fNode`, `na.zinRe`/`zinIm` and
 * `na.zsrcRe`/`zsrcIm` (index `row·points + i`): the node itself in a workspace that keeps
 * every node's, else its kept row.
 * @throws RangeError when the workspace does not keep that node's impedances
 */
export function impedanceRow(na: { zRow?: Int32Array }, node: number): number {
  const { zRow } = na;
  if (!zRow) return node;
  const row = zRow[node];
  if (!(row >= 0)) {
    throw new RangeError(`node ${node}'s impedances are not kept in this node analysis`);
  }
  return row;
}

/** Rows kept of `nodes` by a row map (all without one). */
function keptRows(nodes: number, map: Int32Array | undefined): number {
  let rows = nodes;
  if (map) for (let n = 0; n < nodes; n++) if (map[n] < 0) rows--;
  return rows;
}

/** Allocates a workspace for `points` frequencies; pass it back to reuse the arrays. */
export function createNodeAnalysis(
  built: BuiltChain,
  points: number,
  options: NodeAnalysisOptions = {},
): NodeAnalysis {
  const nodes = built.sections.length + 1;
  const block = Math.min(points, BLOCK);
  const { voltageAt, impedanceAt } = options;
  const vRow = voltageAt ? voltageRows(nodes, voltageAt) : undefined;
  const zRow = impedanceAt ? voltageRows(nodes, impedanceAt, 'impedanceAt') : undefined;
  const rows = keptRows(nodes, vRow);
  const zSize = keptRows(nodes, zRow) * points;
  const na: NodeAnalysis = {
    points,
    nodes,
    freqs: new Float64Array(points),
    fNode: new Float64Array(zSize),
    zinRe: new Float64Array(zSize),
    zinIm: new Float64Array(zSize),
    zsrcRe: new Float64Array(zSize),
    zsrcIm: new Float64Array(zSize),
    vRe: new Float64Array(rows * points),
    vIm: new Float64Array(rows * points),
    emf: new Float64Array(points),
    blockAbcd: new Float64Array(8 * built.sections.length * block),
    blockPair: new Float64Array(2 * block),
  };
  if (vRow) {
    na.vRow = vRow;
    // A node whose voltage is not kept passes it on to the next through this scratch.
    na.blockVRe = new Float64Array(block);
    na.blockVIm = new Float64Array(block);
  }
  if (zRow) {
    na.zRow = zRow;
    // A node whose are not kept passes its frequency and Zsrc on to the next through one
    // block's row; its Zin, which the forward pass reads again, has a row of its own.
    na.blockF = new Float64Array(block);
    na.blockZinRe = new Float64Array(nodes * block);
    na.blockZinIm = new Float64Array(nodes * block);
    na.blockZsrcRe = new Float64Array(block);
    na.blockZsrcIm = new Float64Array(block);
  }
  return na;
}

/** Largest workspace (in doubles) kept between analyses; bigger ones go to the collector. */
const KEEP_DOUBLES = 1 << 22;
const kept = new Map<string, NodeAnalysis>();

/**
 * A workspace for one use (`key`, e.g. "sweep") inside an analysis: the one the previous
 * analysis used for that key when its shape fits, so repeated analyses neither allocate nor
 * zero-fill their arrays. What it holds is valid until the next call with the same key.
 * Workspaces above 32 MiB are not kept (a one-off long sweep should not pin its memory).
 * With `voltageAt` the workspace keeps those nodes' voltages only (one kept with other rows
 * is not reused for it).
 */
export function sharedWorkspace(
  key: string,
  built: BuiltChain,
  points: number,
  options: NodeAnalysisOptions = {},
): NodeAnalysis {
  const ws = kept.get(key);
  if (
    ws &&
    fitsWorkspace(ws, built, points) &&
    sameRows(ws.vRow, built, options.voltageAt) &&
    sameRows(ws.zRow, built, options.impedanceAt)
  ) {
    return ws;
  }
  const fresh = createNodeAnalysis(built, points, options);
  if (!isLongSweep(built, points)) kept.set(key, fresh);
  else {
    kept.delete(key);
    oneOff.add(fresh);
  }
  return fresh;
}

/** Whether a workspace's row map keeps exactly the nodes `at` asks for (every node without it). */
function sameRows(map: Int32Array | undefined, built: BuiltChain, at?: ArrayLike<number>): boolean {
  if (!at) return !map;
  if (!map) return false;
  const want = voltageRows(built.sections.length + 1, at);
  for (let n = 0; n < want.length; n++) if (want[n] !== map[n]) return false;
  return true;
}

/**
 * Whether a workspace of every node's rows for `points` frequencies is too large to keep
 * between analyses (above 32 MiB). Only there does keeping some nodes' frequencies and
 * impedances (`impedanceAt`) pay: over a sweep whose rows stay in the processor's caches,
 * sending the others to a scratch costs more (about 5 % more instructions per node analysis
 * of the bench chain at 2,001 points) than the stores it saves.
 */
export function isLongSweep(built: BuiltChain, points: number): boolean {
  return (built.sections.length + 1) * points * 7 > KEEP_DOUBLES;
}

/** Lets the kept workspaces go (before a process image is saved, e.g. a start-up snapshot). */
export function releaseSharedWorkspaces(): void {
  kept.clear();
}

/** Workspaces {@link sharedWorkspace} handed out without keeping them (too large). */
const oneOff = new WeakSet<NodeAnalysis>();

/**
 * Whether `na` is a workspace no later analysis will reuse: one {@link sharedWorkspace} made
 * for a single use because it was too large to keep. What it holds may be read in place
 * instead of copied (anything else may be overwritten by the next analysis).
 */
export function isOneOffWorkspace(na: NodeAnalysis): boolean {
  return oneOff.has(na);
}

/** Whether `ws` is a workspace of the right shape for `built` over `points` frequencies. */
export function fitsWorkspace(ws: NodeAnalysis, built: BuiltChain, points: number): boolean {
  return (
    ws.points === points &&
    ws.nodes === built.sections.length + 1 &&
    ws.blockAbcd.length === 8 * built.sections.length * Math.min(points, BLOCK)
  );
}

/** A section's block form when it has none: its point form once per point. */
export function pointwiseFill(section: {
  abcd: (f: number, out: Float64Array, o: number) => void;
}): AbcdFill {
  const abcd = section.abcd;
  return (f, fo, n, out, oo) => {
    for (let k = 0; k < n; k++) abcd(f[fo + k], out, oo + 8 * k);
  };
}

/** One-port values at f[fo … fo+n−1] into `pair` (re, im interleaved from 0). */
function fillComplex(
  fn: ComplexFn,
  f: Float64Array,
  fo: number,
  n: number,
  pair: Float64Array,
): void {
  if (fn.fill) fn.fill(f, fo, n, pair, 0, 2);
  else for (let k = 0; k < n; k++) fn(f[fo + k], pair, 2 * k);
}

function fillReal(fn: RealFn, f: Float64Array, fo: number, n: number, out: Float64Array): void {
  if (fn.fill) fn.fill(f, fo, n, out, fo);
  else for (let k = 0; k < n; k++) out[fo + k] = fn(f[fo + k]);
}

/**
 * Runs the node analysis at every frequency of `freqs` (Hz at the chain's input).
 * @param ws a workspace from {@link createNodeAnalysis} to reuse (used when its shape fits)
 */
export function runNodeAnalysis(
  built: BuiltChain,
  freqs: ArrayLike<number>,
  ws?: NodeAnalysis,
): NodeAnalysis {
  const P = freqs.length;
  const na = ws && fitsWorkspace(ws, built, P) ? ws : createNodeAnalysis(built, P);
  // Copied natively: a loop here runs once per analysis, interpreted in a cold process.
  na.freqs.set(freqs);
  if (na.zRow)
    for (let i0 = 0; i0 < P; i0 += BLOCK) runBlockKept(built, na, i0, Math.min(BLOCK, P - i0)); // prettier-ignore
  else for (let i0 = 0; i0 < P; i0 += BLOCK) runBlock(built, na, i0, Math.min(BLOCK, P - i0));
  return na;
}

/** The node analysis of points i0 … i0+n−1 (n ≤ BLOCK). */
function runBlock(built: BuiltChain, na: NodeAnalysis, i0: number, n: number): void {
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
    s.fill(fNode, at, n, m, 8 * j * B);
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
  for (let j = N - 1; j >= 0; j--) backSection(m, 8 * j * B, zinRe, zinIm, j * P + i0, P, n);

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
    forwardSection(m, 8 * j * B, na, j * P + i0, P, n, fromRe, fromIm, fromAt, toRe, toIm, toAt);
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

/**
 * The node analysis of points i0 … i0+n−1 (n ≤ BLOCK). Each node's frequency, impedances and
 * voltages go to its rows, or, in a workspace that does not keep that node's (zRow, vRow), to
 * the block's scratch: the frequency, Zsrc and the voltage to one row that the next node's
 * values overwrite, Zin (which the forward pass reads again) to that node's row of the
 * scratch. The same loops over other places, so the same numbers.
 */
function runBlockKept(built: BuiltChain, na: NodeAnalysis, i0: number, n: number): void {
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
    s.fill(fFrom, fAt, n, m, 8 * j * B);
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
    backSectionTo(m, 8 * j * B, zInRe, zInIm, zAt, toRe, toIm, toAt, n);
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
  for (let j = 0; j < N; j++) {
    vr = vRow ? vRow[j + 1] : j + 1;
    const toRe = vr < 0 ? blockVRe : vRe;
    const toIm = vr < 0 ? blockVIm : vIm;
    const toAt = vr < 0 ? 0 : vr * P + i0;
    row = zRow ? zRow[j + 1] : j + 1;
    const sToRe = row < 0 ? bSr : zsrcRe;
    const sToIm = row < 0 ? bSi : zsrcIm;
    const sToAt = row < 0 ? 0 : row * P + i0;
    const zOutRe = row < 0 ? bZr : zinRe;
    const zOutIm = row < 0 ? bZi : zinIm;
    const zOutAt = row < 0 ? (j + 1) * B : row * P + i0;
    forwardSectionKept(m, 8 * j * B, sRe, sIm, sAt, sToRe, sToIm, sToAt, zOutRe, zOutIm, zOutAt, n, fromRe, fromIm, fromAt, toRe, toIm, toAt); // prettier-ignore
    sRe = sToRe;
    sIm = sToIm;
    sAt = sToAt;
    fromRe = toRe;
    fromIm = toIm;
    fromAt = toAt;
  }
}

/**
 * Zin at a section's input for a block of points, from Zin at its output (read from inRe/inIm
 * at `inAt`, written to outRe/outIm at `outAt`): {@link backSection} between any two places.
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
 * {@link sourceStep} written out in one loop (x − x is 0 exactly for finite x). The EMF is
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
 * {@link voltageStep} written out in one loop, as {@link backSection} is (fused here: the
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
