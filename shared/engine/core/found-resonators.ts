/**
 * Resonances the chain's network shows that no stage declares: parallel ones wherever B rises
 * through zero at a node, series ones in the through paths (found-series.ts), each kept when
 * its tuned circuit resonates by itself (detached Q of at least MIN_DETACHED_Q) and merged
 * with the views of one mode already claimed (resonators.ts describes the rules).
 */
import {
  locateSeries,
  risingLoopCrossings,
  seriesFigures,
  seriesSections,
  unloadedProbe,
  unloadedShuntQ,
  type SeriesFigures,
} from './found-series';
import { gatherCandidates } from './found-candidates';
import type { Probe } from './probe';
import { risingCrossings, type NodeResonance } from './resonance-search';
import {
  downstreamOf,
  locate,
  MIN_DETACHED_Q,
  sameMode,
  userNodeOf,
  type Claim,
  type Context,
  type ResonatorFinding,
} from './resonator-context';
import { shuntFigures, type ShuntFigures } from './shunt-tank';
import { owningStage, type Topology } from './topology';
import type { BuiltChain } from './build';

/**
 * The nodes {@link foundResonances} scans for a rising susceptance: one per electrical node,
 * not claimed by a coupled pair, not owned by a matching network or a filter.
 */
export function shuntScanNodes(
  built: BuiltChain,
  topo: Topology,
  claimed: ReadonlySet<number>,
): number[] {
  const out: number[] = [];
  for (let n = 0; n < built.sections.length + 1; n++) {
    if (topo.group[n] !== n || claimed.has(n)) continue;
    const category = owningStage(built, topo, n).definition.category;
    if (category === 'matching' || category === 'filter') continue;
    out.push(n);
  }
  return out;
}

/**
 * The nodes {@link foundSeries} scans for a rising loop reactance: the first section of each
 * run of series sections (given by `series`) not owned by a matching network or a filter.
 */
export function seriesScanNodes(built: BuiltChain, topo: Topology, series: Uint8Array): number[] {
  const out: number[] = [];
  for (let n = 0; n < series.length; n++) {
    if (!series[n] || (n > 0 && series[n - 1])) continue;
    const category = built.twoPorts[topo.stageOf[n]].definition.category;
    if (category === 'matching' || category === 'filter') continue;
    out.push(n);
  }
  return out;
}

/**
 * Resonances the network shows that no declared resonator covers. A found resonance is a
 * tuned circuit only when that circuit resonates by itself: with the downstream side cut away
 * (the detached measurement) it still shows a resonance of Q at least MIN_DETACHED_Q. What
 * only the interplay with the load produces (a feeder transforming a mismatch) is not
 * reported. Nodes owned by a matching network or a filter are left to that stage: a match is
 * loaded by design and judged by its own flags (match missed, q-budget), and a filter either
 * declares its tuned circuits or is a block made to work between its stated terminations.
 */
export function foundResonances(ctx: Context, claimed: Set<number>): ResonatorFinding[] {
  const { built, topo, gridNa, probe } = ctx;
  // What covers a claim now (the declared resonators) covers it when the merge below asks.
  const gathering = gatherCandidates<ShuntFigures>(
    built.settings.f0Hz,
    (n, res) => {
      const fig = shuntFigures(built, topo, probe, n, res, null);
      return fig.detachedQ !== null && fig.detachedQ >= MIN_DETACHED_Q ? fig : null;
    },
    (claim) => ctx.claims.some((k) => sameMode(k, claim)),
  );
  for (const n of shuntScanNodes(built, topo, claimed)) {
    for (const b of risingCrossings(gridNa, n)) {
      const res = locate(gridNa, probe, n, b);
      if (!res || !(res.q > 0) || !(res.g > 0)) continue;
      gathering.offer(n, res, { segment: topo.segment[n], fr: res.fr, bw: res.fr / res.q });
    }
  }
  const candidates = gathering.candidates;
  // Highest impedance first: the node where the tuned circuit's voltage is.
  candidates.sort((a, b) => a.res.g - b.res.g);
  const out: ResonatorFinding[] = [];
  let unloaded: Probe | null = null;
  for (const c of candidates) {
    // An unmeasured candidate is covered (gatherCandidates), so it stops here.
    if (ctx.claims.some((k) => sameMode(k, c.claim))) continue;
    const fig = c.fig!;
    ctx.claims.push(c.claim);
    unloaded ??= unloadedProbe(built, false);
    fig.unloadedQ = unloadedShuntQ(unloaded, c.node, fig.cut, c.res);
    out.push(foundTank(ctx, c.node, fig));
  }
  return out;
}

/** A series resonance found in a through path, measured, before views of one mode merge. */
interface SeriesCandidate {
  node: number;
  res: NodeResonance;
  fig: SeriesFigures;
  claim: Claim;
}

/**
 * Series resonances in the through paths (found-series.ts) that no declared or parallel
 * resonator covers: at the first section of each run of series sections, the loop's rising
 * zero of reactance, kept when the tuned circuit detached (downstream shorted) still has a Q
 * of at least MIN_DETACHED_Q. Series sections owned by a matching network or a filter are
 * left to that stage, as for parallel ones.
 */
export function foundSeries(ctx: Context): ResonatorFinding[] {
  const { built, topo, gridNa, probe } = ctx;
  const series = seriesSections(built);
  const candidates: SeriesCandidate[] = [];
  let unloaded: Probe | null = null;
  for (const n of seriesScanNodes(built, topo, series)) {
    for (const b of risingLoopCrossings(gridNa, n)) {
      const res = locateSeries(gridNa, probe, n, b);
      if (!res || !(res.q > 0) || !(res.g > 0)) continue;
      unloaded ??= unloadedProbe(built, true);
      const fig = seriesFigures(built, series, probe, unloaded, n, res);
      if (!(fig.detachedQ !== null && fig.detachedQ >= MIN_DETACHED_Q)) continue;
      candidates.push({ node: n, res, fig, claim: { segment: topo.segment[n], fr: res.fr, bw: res.fr / res.q } }); // prettier-ignore
    }
  }
  // Lowest loop resistance first: the view where the most current flows.
  candidates.sort((a, b) => a.res.g - b.res.g);
  const out: ResonatorFinding[] = [];
  for (const c of candidates) {
    if (ctx.claims.some((k) => sameMode(k, c.claim))) continue;
    ctx.claims.push(c.claim);
    out.push(foundLoop(ctx, c));
  }
  return out;
}

/** The report of a found series resonance. */
function foundLoop(ctx: Context, { node, fig: all }: SeriesCandidate): ResonatorFinding {
  const { built, topo } = ctx;
  const { cut, ...fig } = all;
  const stage = built.twoPorts[topo.stageOf[node]];
  const partOf = [stage.id];
  for (let j = node; j < cut; j++) {
    const id = built.twoPorts[topo.stageOf[j]].id;
    if (!partOf.includes(id)) partOf.push(id);
  }
  const labels = partOf.map((id) => `"${built.twoPorts.find((s) => s.id === id)?.label ?? id}"`); // prettier-ignore
  return {
    stageId: stage.id,
    label: `series tuned circuit in "${stage.label}"`,
    kind: 'series',
    origin: 'found',
    partOf,
    node: null,
    ...fig,
    flat: node,
    f0LocalHz: built.f0AtFlatNode[node],
    downstreamLabel: downstreamOf(built, cut),
    name: `Series tuned circuit in the through path (${labels.join(' with ')})`,
  };
}

/** The report of a found parallel resonance. */
function foundTank(ctx: Context, node: number, all: ShuntFigures): ResonatorFinding {
  const { built, topo } = ctx;
  const { cut, ...fig } = all;
  const stage = owningStage(built, topo, node);
  const partOf = [stage.id];
  for (let j = node; j < cut; j++) {
    const id = built.twoPorts[topo.stageOf[j]].id;
    if (!partOf.includes(id)) partOf.push(id);
  }
  const userNode = userNodeOf(built, topo, node);
  const where = userNode !== null ? `at node ${userNode}` : `inside "${stage.label}"`;
  const labels = partOf.map((id) => `"${built.twoPorts.find((s) => s.id === id)?.label ?? id}"`); // prettier-ignore
  return {
    stageId: stage.id,
    label: `tuned circuit ${where}`,
    kind: 'shunt',
    origin: 'found',
    partOf,
    node: userNode,
    ...fig,
    flat: node,
    f0LocalHz: built.f0AtFlatNode[node],
    downstreamLabel: downstreamOf(built, cut),
    name: `Tuned circuit ${where} (${labels.join(' with ')})`,
  };
}
