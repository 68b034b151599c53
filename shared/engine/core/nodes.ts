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
 * - Voltages (PEAK phasors): V[0] = Es·Zin[0]/(Zs + Zin[0]), V[j+1] = V[j]/(A + B/Zin[j+1]);
 *   across a section that is one shunt admittance (Section.ladder 'shunt') V[j+1] = V[j], copied.
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
import type { AbcdFill } from '../types';
import type { BuiltChain } from './build';
import { MIN_NODE_HZ } from './node-steps';
import { runBlock } from './node-block';
import { runBlockKept } from './node-block-kept';

export {
  backSection,
  backStep,
  forwardStep,
  sourceStep,
  voltageSection,
  voltageStep,
} from './node-steps';

// Globals read once: inside some hosts (test runners' VM contexts) each global lookup in a
// hot loop is slow.

export { MIN_NODE_HZ };

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
  /** How many runs have written this workspace (a reader in place can tell it was reused). */
  runs: number;
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
    runs: 0,
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
  na.runs++;
  // Copied natively: a loop here runs once per analysis, interpreted in a cold process.
  na.freqs.set(freqs);
  if (na.zRow)
    for (let i0 = 0; i0 < P; i0 += BLOCK) runBlockKept(built, na, i0, Math.min(BLOCK, P - i0)); // prettier-ignore
  else for (let i0 = 0; i0 < P; i0 += BLOCK) runBlock(built, na, i0, Math.min(BLOCK, P - i0));
  return na;
}
