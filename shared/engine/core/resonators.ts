/**
 * Resonators of a chain: the ones its stages declare and the ones its network shows.
 *
 * Declared shunt tank at node n: Y(f) = 1/Zsrc[n] + 1/Zin[n] = G + jB (everything attached to
 * the node); fr is where B rises through zero nearest f0; loaded Q = (ωr/2G)·dB/dω. Detached Q
 * cuts the network open where the tuned circuit ends (topology.ts); unloaded Q uses the tank's
 * own admittance. Series resonator: loop impedance Z = Zsrc(in) + Zseries + Zin(out) = R + jX,
 * Q = (ωr/2R)·dX/dω. Coupled pairs: see coupled-pair.ts.
 *
 * Found resonances: wherever B rises through zero at any node of the node analysis (stage
 * boundaries and internal section nodes alike) with a loaded Q of at least MIN_FOUND_Q. One
 * resonance shows at every node its network reaches, so views of one mode are one resonator:
 * two resonances in the same bilateral segment (no amplifier or mixer between them) closer
 * than the wider of their bandwidths are one, reported at the node of highest impedance (1/G),
 * where the tuned circuit's voltage is; a declared tank, or a coupled pair's tanks and peak,
 * take the place of any found one they coincide with in that sense. Nodes inside or at the
 * ends of a coupled pair belong to the pair.
 */
import type { ResonatorDecl, ResonatorReport } from '../types';
import type { BuiltChain, BuiltStage } from './build';
import { coupledTank, pairPeak } from './coupled-pair';
import { ownResonance, resonate, seriesExtract } from './extract-resonance';
import { runNodeAnalysis, type NodeAnalysis } from './nodes';
import {
  locateSeries,
  risingLoopCrossings,
  seriesFigures,
  seriesSections,
  unloadedProbe,
  unloadedShuntQ,
  type SeriesFigures,
} from './found-series';
import { createProbe, type Probe } from './probe';
import {
  attached,
  bracketingGrid,
  resonanceIn,
  risingCrossings,
  type Bracket,
  type NodeResonance,
} from './resonance-search';
import { shuntFigures, type ShuntFigures } from './shunt-tank';
import { chainTopology, groupEnd, owningStage, type Topology } from './topology';

export { bisectRising, nearestRisingCrossing } from './extract-resonance';
export { searchRange } from './resonance-search';

const { abs, log, max, min } = Math;

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
interface Claim {
  segment: number;
  fr: number;
  bw: number;
}

const nn = (x: number | null | undefined) => (x === undefined || Number.isNaN(x) ? null : x);

/**
 * User-level node of a flat node, else of another flat node of its electrical node, or null
 * when it is inside a stage.
 */
function userNodeOf(built: BuiltChain, topo: Topology, flat: number): number | null {
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
function downstreamOf(built: BuiltChain, cut: number): string {
  const inside = built.twoPorts.find(
    (s) => cut > s.firstSection && cut < s.firstSection + s.sectionCount,
  );
  if (inside) return `the rest of "${inside.label}"`;
  const next = built.twoPorts.find((s) => s.firstSection >= cut && s.sectionCount > 0);
  return `"${(next ?? built.load).label}"`;
}

/** The bracket whose interpolated crossing is nearest `target` (input Hz), or null. */
function nearestBracket(na: NodeAnalysis, node: number, target: number): Bracket | null {
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

function locate(na: NodeAnalysis, probe: Probe, node: number, b: Bracket): NodeResonance | null {
  const scratch = new Float64Array(2);
  return resonanceIn(probe, node, na.freqs[b.k], na.freqs[b.k + 1], b.sign, attached, scratch);
}

const sameMode = (a: Claim, b: Claim) =>
  a.segment === b.segment && abs(a.fr - b.fr) <= max(a.bw, b.bw);

interface Context {
  built: BuiltChain;
  topo: Topology;
  gridNa: NodeAnalysis;
  probe: Probe;
  claims: Claim[];
}

/** A shunt tank a stage declares (not part of a coupled pair). */
function declaredShunt(
  ctx: Context,
  stage: BuiltStage,
  decl: ResonatorDecl & { kind: 'shunt' },
  name: string,
): ResonatorFinding {
  const { built, topo, gridNa, probe } = ctx;
  const flat = stage.firstSection + max(0, min(decl.node, stage.sectionCount));
  const b = nearestBracket(gridNa, flat, built.settings.f0Hz);
  const att = b ? locate(gridNa, probe, flat, b) : null;
  const base = {
    stageId: stage.id,
    label: decl.label,
    kind: 'shunt' as const,
    origin: 'declared' as const,
    node: userNodeOf(built, topo, flat),
    flat,
    fIn: att ? att.fIn : null,
    f0LocalHz: built.f0AtFlatNode[flat],
    name,
  };
  if (!att) {
    return {
      ...base,
      resonanceHz: null,
      loadedQ: null,
      unloadedQ: null,
      bandwidthHz: null,
      detachedQ: null,
      detachedBandwidthHz: null,
      loadingRatio: null,
      downstreamShare: null,
      downstreamLabel: downstreamOf(built, flat),
    };
  }
  const { fIn: _f, cut, ...fig } = shuntFigures(built, topo, probe, flat, att, decl.ownAdmittance); // prettier-ignore
  ctx.claims.push({ segment: topo.segment[flat], fr: fig.resonanceHz, bw: fig.bandwidthHz ?? 0 });
  return { ...base, ...fig, downstreamLabel: downstreamOf(built, cut) };
}

/** A series resonator a stage declares. */
function declaredSeries(
  ctx: Context,
  stage: BuiltStage,
  decl: ResonatorDecl & { kind: 'series' },
  name: string,
): ResonatorFinding {
  const { built, gridNa } = ctx;
  const section = stage.firstSection + decl.section;
  const res =
    decl.section >= 0 && decl.section < stage.sectionCount
      ? resonate(built, gridNa.freqs, gridNa, seriesExtract(built, section), built.settings.f0Hz)
      : null;
  const q = nn(res?.q);
  if (res && q) ctx.claims.push({ segment: ctx.topo.segment[section], fr: res.fr, bw: res.fr / q });
  return {
    stageId: stage.id,
    label: decl.label,
    kind: 'series',
    origin: 'declared',
    node: null,
    resonanceHz: res ? res.fr : null,
    loadedQ: q,
    unloadedQ: res ? ownResonance(decl.ownImpedance, res.fr) : null,
    bandwidthHz: res && q ? res.fr / q : null,
    detachedQ: null,
    detachedBandwidthHz: null,
    loadingRatio: null,
    downstreamShare: null,
    flat: section,
    fIn: res ? res.fIn : null,
    f0LocalHz: built.f0AtFlatNode[min(section, built.f0AtFlatNode.length - 1)],
    downstreamLabel: downstreamOf(built, section + 1),
    name,
  };
}

/** Both tanks of a coupled pair, with where the pair peaks. */
function declaredPair(
  ctx: Context,
  stage: BuiltStage,
  decls: (ResonatorDecl & { kind: 'shunt' })[],
  claimed: Set<number>,
): ResonatorFinding[] {
  const { built, topo, gridNa, probe } = ctx;
  const end = stage.firstSection + stage.sectionCount;
  for (let n = stage.firstSection; n <= end; n++) claimed.add(topo.group[n]);
  const peak = pairPeak(built, gridNa, probe, stage);
  const segment = topo.segment[end];
  let peakLocal: number | null = null;
  if (peak) {
    probe.at(peak.peakHz, end);
    peakLocal = probe.fNode[end];
    ctx.claims.push({ segment, fr: peakLocal, bw: peak.bandwidthHz ?? 0 });
  }
  return decls.map((decl) => {
    const fig = coupledTank(built, gridNa, stage, decl);
    const bw = fig.resonanceHz !== null && fig.loadedQ ? fig.resonanceHz / fig.loadedQ : null;
    if (fig.resonanceHz !== null) ctx.claims.push({ segment, fr: fig.resonanceHz, bw: bw ?? 0 });
    const first = decl.coupledPartner === 'downstream';
    return {
      stageId: stage.id,
      label: decl.label,
      kind: 'shunt',
      origin: 'declared',
      node: userNodeOf(built, topo, fig.flat),
      resonanceHz: fig.resonanceHz,
      loadedQ: fig.loadedQ,
      unloadedQ: fig.unloadedQ,
      bandwidthHz: bw,
      detachedQ: fig.detachedQ,
      detachedBandwidthHz: fig.detachedFr !== null && fig.detachedQ ? fig.detachedFr / fig.detachedQ : null, // prettier-ignore
      loadingRatio: fig.loadingRatio,
      downstreamShare: fig.downstreamShare,
      pairPeakHz: peakLocal,
      pairBandwidthHz: peak ? peak.bandwidthHz : null,
      flat: fig.flat,
      fIn: fig.fIn,
      f0LocalHz: built.f0AtFlatNode[fig.flat],
      downstreamLabel: first ? 'its coupled partner' : downstreamOf(built, fig.flat),
      name: `Tank "${stage.label}" (${decl.label})`,
    };
  });
}

/** A resonance found at a node, measured, before views of one mode are merged. */
interface Candidate {
  node: number;
  res: NodeResonance;
  fig: ShuntFigures;
  claim: Claim;
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
function foundResonances(ctx: Context, claimed: Set<number>): ResonatorFinding[] {
  const { built, topo, gridNa, probe } = ctx;
  const candidates: Candidate[] = [];
  const f0 = built.settings.f0Hz;
  for (let n = 0; n < probe.nodes; n++) {
    if (topo.group[n] !== n || claimed.has(n)) continue;
    const category = owningStage(built, topo, n).definition.category;
    if (category === 'matching' || category === 'filter') continue;
    for (const b of risingCrossings(gridNa, n)) {
      const res = locate(gridNa, probe, n, b);
      if (!res || !(res.q > 0) || !(res.g > 0)) continue;
      // Signal and image reach one node's tuned circuit at the same frequency: keep the
      // input frequency nearer f0.
      const twin = candidates.find((c) => c.node === n && abs(c.res.fr / res.fr - 1) < 1e-6);
      if (twin && abs(log(res.fIn / f0)) >= abs(log(twin.res.fIn / f0))) continue;
      const fig = shuntFigures(built, topo, probe, n, res, null);
      if (!(fig.detachedQ !== null && fig.detachedQ >= MIN_DETACHED_Q)) continue;
      const claim = { segment: topo.segment[n], fr: res.fr, bw: res.fr / res.q };
      if (twin) Object.assign(twin, { res, fig, claim });
      else candidates.push({ node: n, res, fig, claim });
    }
  }
  // Highest impedance first: the node where the tuned circuit's voltage is.
  candidates.sort((a, b) => a.res.g - b.res.g);
  const out: ResonatorFinding[] = [];
  let unloaded: Probe | null = null;
  for (const c of candidates) {
    if (ctx.claims.some((k) => sameMode(k, c.claim))) continue;
    ctx.claims.push(c.claim);
    unloaded ??= unloadedProbe(built, false);
    c.fig.unloadedQ = unloadedShuntQ(unloaded, c.node, c.fig.cut, c.res);
    out.push(foundTank(ctx, c));
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
function foundSeries(ctx: Context): ResonatorFinding[] {
  const { built, topo, gridNa, probe } = ctx;
  const series = seriesSections(built);
  const candidates: SeriesCandidate[] = [];
  let unloaded: Probe | null = null;
  for (let n = 0; n < series.length; n++) {
    if (!series[n] || (n > 0 && series[n - 1])) continue;
    const category = built.twoPorts[topo.stageOf[n]].definition.category;
    if (category === 'matching' || category === 'filter') continue;
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
function foundTank(ctx: Context, { node, fig: all }: Candidate): ResonatorFinding {
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

/**
 * Analyses every resonator the stages declare and every one the network shows.
 * @param sweepNa the sweep's node analysis, reused to bracket resonances when it spans the
 *   search range with enough points (else a search grid is analysed)
 */
export function analyzeResonators(
  built: BuiltChain,
  sweepNa: NodeAnalysis | null = null,
): ResonatorFinding[] {
  const topo = chainTopology(built);
  const gridNa = bracketingGrid(built, sweepNa, (f) => runNodeAnalysis(built, f));
  const ctx: Context = { built, topo, gridNa, probe: createProbe(built), claims: [] };
  const claimed = new Set<number>();
  const declared: ResonatorFinding[] = [];
  for (const stage of built.twoPorts) {
    const decls = stage.model.resonators ?? [];
    const pair = decls.filter(
      (d): d is ResonatorDecl & { kind: 'shunt' } => d.kind === 'shunt' && !!d.coupledPartner,
    );
    if (pair.length > 0) declared.push(...declaredPair(ctx, stage, pair, claimed));
    const many = decls.length > 1;
    for (const decl of decls) {
      const name = `${decl.kind === 'shunt' ? 'Tank' : 'Series resonator'} "${stage.label}"${many ? ` (${decl.label})` : ''}`; // prettier-ignore
      if (decl.kind === 'series') declared.push(declaredSeries(ctx, stage, decl, name));
      else if (!decl.coupledPartner) declared.push(declaredShunt(ctx, stage, decl, name));
    }
  }
  const found = foundResonances(ctx, claimed);
  const loops = foundSeries(ctx);
  return [...declared, ...found, ...loops].sort((a, b) => a.flat - b.flat);
}
