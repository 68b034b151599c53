/**
 * A parallel resonance at a node, measured loaded, detached and unloaded: the figures every
 * shunt tuned circuit reports, whether its stage declared it or the chain's network showed it.
 *
 * Loaded: the node's total admittance. Detached: the network cut open where the tuned circuit
 * ends (topology.ts, detachCut), searched for its own resonance near the loaded one. Downstream
 * share: the conductance the cut removes, as a share of the total, at the loaded resonance.
 */
import type { ComplexFn } from '../types';
import type { BuiltChain } from './build';
import { ownResonance, type OwnResonanceMemo } from './extract-resonance';
import type { Probe } from './probe';
import { cutAt, resonanceNear, type NodeResonance } from './resonance-search';
import { detachCut, type Topology } from './topology';

/** The figures of one shunt tuned circuit. */
export interface ShuntFigures {
  resonanceHz: number;
  fIn: number;
  loadedQ: number | null;
  unloadedQ: number | null;
  bandwidthHz: number | null;
  detachedQ: number | null;
  detachedBandwidthHz: number | null;
  loadingRatio: number | null;
  downstreamShare: number | null;
  /** Flat node where the detached measurement cuts the network open. */
  cut: number;
}

const nn = (x: number) => (Number.isNaN(x) ? null : x);

/**
 * Measures a located loaded resonance at `node`: detached Q, share, unloaded Q.
 * @param memo the analysis's own-resonance answers so far (see ownResonance)
 */
export function shuntFigures(
  built: BuiltChain,
  topo: Topology,
  probe: Probe,
  node: number,
  att: NodeResonance,
  own: ComplexFn | null,
  memo?: OwnResonanceMemo,
): ShuntFigures {
  const scratch = new Float64Array(2);
  const cut = detachCut(built, topo, node, att.fr);
  const det = resonanceNear(probe, node, att.fIn, att.sign, cutAt(cut), scratch);
  // Conductance at fr with the downstream side cut away.
  probe.at(att.fIn, node);
  probe.cutAdmittance(node, cut, scratch);
  const gDet = scratch[0];
  const qA = nn(att.q);
  const qD = det ? nn(det.q) : null;
  return {
    resonanceHz: att.fr,
    fIn: att.fIn,
    loadedQ: qA,
    unloadedQ: own ? ownResonance(own, att.fr, memo) : null,
    bandwidthHz: qA ? att.fr / qA : null,
    detachedQ: qD,
    detachedBandwidthHz: det && qD ? det.fr / qD : null,
    loadingRatio: qA && qD ? qA / qD : null,
    downstreamShare: att.g > 0 && Number.isFinite(gDet) ? (att.g - gDet) / att.g : null,
    cut,
  };
}
