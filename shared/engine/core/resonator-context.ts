/**
 * What the resonator searches share: the finding they report, the places in frequency a
 * resonator already covers (claims, for merging views of one mode), and the small readers of
 * the grid and the chain's layout the declared and the found searches both use.
 */
import type { ResonatorReport } from '../types';
import type { BuiltChain } from './build';
import type { OwnResonanceMemo } from './own-resonance';
import type { NodeAnalysis } from './nodes';
import type { Probe } from './probe';
import type { ShapeMemo } from './response-shape';
import {
  attached,
  resonanceIn,
  risingCrossings,
  type Bracket,
  type NodeResonance,
} from './resonance-search';
import { groupEnd, type Topology } from './topology';

const { abs, log, max } = Math;

/**
 * Lowest Q a found resonance's tuned circuit needs by itself (detached) to be reported: below
 * it the circuit hardly selects. Our rule.
 */
export const MIN_DETACHED_Q = 2;

/** A resonator report plus what the flags need to word their sentences. */
export interface ResonatorFinding extends ResonatorReport {
  /** Flat node (shunt) or flat index of the section (series). */
  flat: number;
  /** Input frequency of the resonance, Hz (null when not found): where a study re-locates it. */
  fIn: number | null;
  /** Design frequency at the resonator's node, Hz. */
  f0LocalHz: number;
  /** Label of what the tank's downstream side begins with. */
  downstreamLabel: string;
  /** How a sentence names it, e.g. `Tank "Preselector"`. */
  name: string;
}

/**
 * A place in frequency that a resonator already covers, for merging views of one mode: the
 * node's own frequency (behind a mixer two input frequencies, signal and image, reach the
 * same tuned circuit at the same frequency).
 */
export interface Claim {
  segment: number;
  fr: number;
  bw: number;
}

export const nn = (x: number | null | undefined) => (x === undefined || Number.isNaN(x) ? null : x);

/**
 * User-level node of a flat node, else of another flat node of its electrical node, or null
 * when it is inside a stage.
 */
export function userNodeOf(built: BuiltChain, topo: Topology, flat: number): number | null {
  const exact = built.userNodeFlat.indexOf(flat);
  if (exact >= 0) return exact;
  const first = topo.group[flat];
  const last = groupEnd(topo, first);
  for (let n = first; n <= last; n++) {
    const k = built.userNodeFlat.indexOf(n);
    if (k >= 0) return k;
  }
  return null;
}

/** What the downstream side begins with, for a cut at flat node `cut`. */
export function downstreamOf(built: BuiltChain, cut: number): string {
  const inside = built.twoPorts.find(
    (s) => cut > s.firstSection && cut < s.firstSection + s.sectionCount,
  );
  if (inside) return `the rest of "${inside.label}"`;
  const next = built.twoPorts.find((s) => s.firstSection >= cut && s.sectionCount > 0);
  return `"${(next ?? built.load).label}"`;
}

/** The bracket whose interpolated crossing is nearest `target` (input Hz), or null. */
export function nearestBracket(na: NodeAnalysis, node: number, target: number): Bracket | null {
  let best: Bracket | null = null;
  let bestDist = Infinity;
  const f = na.freqs;
  for (const b of risingCrossings(na, node)) {
    const d = abs(log(f[b.k] / target) + log(f[b.k + 1] / target));
    if (d < bestDist) {
      bestDist = d;
      best = b;
    }
  }
  return best;
}

export function locate(
  na: NodeAnalysis,
  probe: Probe,
  node: number,
  b: Bracket,
): NodeResonance | null {
  const scratch = new Float64Array(2);
  return resonanceIn(probe, node, na.freqs[b.k], na.freqs[b.k + 1], b.sign, attached, scratch, b.lo, b.hi); // prettier-ignore
}

export const sameMode = (a: Claim, b: Claim) =>
  a.segment === b.segment && abs(a.fr - b.fr) <= max(a.bw, b.bw);

export interface Context {
  built: BuiltChain;
  topo: Topology;
  gridNa: NodeAnalysis;
  probe: Probe;
  claims: Claim[];
  /** Elements' own resonances searched so far in this analysis. */
  own: OwnResonanceMemo;
  /** Where a coupled pair's response shape is kept for the selectivity (gridNa is the sweep). */
  shapes?: ShapeMemo;
}
