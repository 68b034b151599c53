/**
 * Where tuned circuits can be in a built chain, from its sections alone: which flat nodes are
 * one electrical node, which nodes a passive path joins, and where a tuned circuit ends.
 */
import type { TwoPortModel } from '../types';
import type { BuiltChain, BuiltStage } from './build';

/** Facts about the sections of a chain, worked out once per analysis. */
export interface Topology {
  /** Section j is a shunt admittance alone (A = D = 1, B = 0): nodes j and j+1 are one node. */
  shunt: Uint8Array;
  /** For each flat node, the first flat node of its electrical node. */
  group: Int32Array;
  /**
   * For each flat node, the bilateral segment it lies in: segments are split by unilateral
   * (and frequency-changing) sections, across which no resonance is shared.
   */
  segment: Int32Array;
  /** For each section, the index in built.twoPorts of its stage. */
  stageOf: Int32Array;
}

/** Builds the topology by evaluating each section once at its design frequency. */
export function chainTopology(built: BuiltChain): Topology {
  const N = built.sections.length;
  const shunt = new Uint8Array(N);
  const m = new Float64Array(8);
  for (let j = 0; j < N; j++) {
    built.sections[j].abcd(built.f0AtFlatNode[j], m, 0);
    const isShunt =
      m[0] === 1 && m[1] === 0 && m[2] === 0 && m[3] === 0 && m[6] === 1 && m[7] === 0;
    shunt[j] = isShunt ? 1 : 0;
  }
  const group = new Int32Array(N + 1);
  const segment = new Int32Array(N + 1);
  for (let n = 1; n <= N; n++) {
    const s = built.sections[n - 1];
    group[n] = shunt[n - 1] ? group[n - 1] : n;
    segment[n] = s.unilateral || s.translate ? segment[n - 1] + 1 : segment[n - 1];
  }
  return { shunt, group, segment, stageOf: built.sectionStage };
}

/** The last flat node of the electrical node that starts at `first`. */
export function groupEnd(topo: Topology, first: number): number {
  let n = first;
  while (n < topo.shunt.length && topo.shunt[n]) n++;
  return n;
}

/** A stage whose sections are all passive and bilateral (no gain, no frequency change). */
function isPassive(stage: BuiltStage<TwoPortModel>): boolean {
  return stage.model.sections.every((s) => !s.unilateral && !s.translate);
}

/**
 * The stage a resonance at flat node `node` belongs to: the stage it is inside, else the stage
 * that ends at its electrical node's first flat node (the coil that is tuned), else the first
 * stage (a resonance at the source terminal).
 */
export function owningStage(built: BuiltChain, topo: Topology, node: number): BuiltStage {
  const inside = built.twoPorts.find(
    (s) => node > s.firstSection && node < s.firstSection + s.sectionCount,
  );
  if (inside) return inside;
  const first = topo.group[node];
  if (first > 0) return built.twoPorts[topo.stageOf[first - 1]];
  return built.twoPorts[0] ?? built.source;
}

/**
 * Where the detached measurement cuts the chain open: everything downstream of a tuned
 * circuit is removed, and what belongs to the tuned circuit stays. The rule:
 * 1. a node inside a passive stage (the tap of a tapped-C transformer or a tapped coil) keeps
 *    the rest of that stage, which is the tuned circuit's own network;
 * 2. then the chain is cut at the first node after the last reactive shunt element across
 *    that same electrical node (the next stage's tuning capacitor, say): a shunt section whose
 *    susceptance exceeds its conductance at fr (its own Q above 1); a mostly resistive shunt
 *    (a detector's input resistance) is load, not tuned circuit, unless a reactive one follows.
 * Returns the flat node where the network is left open.
 */
export function detachCut(
  built: BuiltChain,
  topo: Topology,
  node: number,
  frAtNode: number,
): number {
  let cut = node;
  const inside = built.twoPorts.find(
    (s) => node > s.firstSection && node < s.firstSection + s.sectionCount,
  );
  if (inside && isPassive(inside)) cut = inside.firstSection + inside.sectionCount;
  const m = new Float64Array(8);
  let n = cut;
  while (n < topo.shunt.length && topo.shunt[n]) {
    built.sections[n].abcd(frAtNode, m, 0);
    if (Math.abs(m[5]) > Math.abs(m[4])) cut = n + 1; // C entry of a shunt section = its Y
    n++;
  }
  return cut;
}
