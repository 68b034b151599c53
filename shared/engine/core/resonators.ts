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
import type { ResonatorDecl } from '../types';
import type { BuiltChain, BuiltStage } from './build';
import { coupledTank, pairPeak, pairTankFlat, translatedBefore } from './coupled-pair';
import {
  ownResonance,
  probePointEval,
  resonate,
  seriesExtract,
  seriesLoopOnGrid,
} from './extract-resonance';
import { foundResonances, foundSeries, seriesScanNodes, shuntScanNodes } from './found-resonators';
import { seriesSections } from './found-series';
import { runNodeAnalysis, type NodeAnalysis } from './nodes';
import { probeOf } from './probe';
import { bracketingGrid } from './resonance-search';
import type { ShapeMemo } from './response-shape';
import {
  downstreamOf,
  locate,
  nearestBracket,
  nn,
  userNodeOf,
  type Context,
  type ResonatorFinding,
} from './resonator-context';
import { shuntFigures } from './shunt-tank';
import { chainTopology, type Topology } from './topology';

export { bisectRising, nearestRisingCrossing } from './extract-resonance';
export { searchRange } from './resonance-search';
export { MIN_DETACHED_Q, type ResonatorFinding } from './resonator-context';

const { max, min } = Math;

/** The flat node of a shunt tank a stage declares. */
function shuntFlat(stage: BuiltStage, decl: ResonatorDecl & { kind: 'shunt' }): number {
  return stage.firstSection + max(0, min(decl.node, stage.sectionCount));
}

/** A stage's coupled pair's tanks (none when it declares no pair). */
function pairDecls(stage: BuiltStage): (ResonatorDecl & { kind: 'shunt' })[] {
  return (stage.model.resonators ?? []).filter(
    (d): d is ResonatorDecl & { kind: 'shunt' } => d.kind === 'shunt' && !!d.coupledPartner,
  );
}

/** The electrical nodes a coupled pair holds: every node inside or at the ends of the pair. */
function pairClaims(built: BuiltChain, topo: Topology): Set<number> {
  const claimed = new Set<number>();
  for (const stage of built.twoPorts) {
    if (pairDecls(stage).length === 0) continue;
    const end = stage.firstSection + stage.sectionCount;
    for (let n = stage.firstSection; n <= end; n++) claimed.add(topo.group[n]);
  }
  return claimed;
}

/**
 * The nodes whose frequency and impedances {@link analyzeResonators} reads from the sweep's
 * node analysis, in ascending order: each declared resonator's (a series one's section input
 * and output, a coupled pair's tank only after a frequency change), and every node the search for found resonances scans. The analysis keeps
 * those rows of its sweep only (`impedanceAt`); any other read is refused (`impedanceRow`).
 */
export function resonatorNodes(built: BuiltChain, topo: Topology = chainTopology(built)): number[] {
  const nodes = new Set<number>();
  for (const stage of built.twoPorts) {
    for (const decl of stage.model.resonators ?? []) {
      if (decl.kind === 'series') {
        if (decl.section >= 0 && decl.section < stage.sectionCount) {
          nodes.add(stage.firstSection + decl.section);
          nodes.add(stage.firstSection + decl.section + 1);
        }
      } else if (!decl.coupledPartner) nodes.add(shuntFlat(stage, decl));
      else if (translatedBefore(built, pairTankFlat(stage, decl))) {
        nodes.add(pairTankFlat(stage, decl));
      }
    }
  }
  for (const n of shuntScanNodes(built, topo, pairClaims(built, topo))) nodes.add(n);
  for (const n of seriesScanNodes(built, topo, seriesSections(built))) nodes.add(n);
  return [...nodes].sort((a, b) => a - b);
}

/** A shunt tank a stage declares (not part of a coupled pair). */
function declaredShunt(
  ctx: Context,
  stage: BuiltStage,
  decl: ResonatorDecl & { kind: 'shunt' },
  name: string,
): ResonatorFinding {
  const { built, topo, gridNa, probe } = ctx;
  const flat = shuntFlat(stage, decl);
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
  const { fIn: _f, cut, ...fig } = shuntFigures(built, topo, probe, flat, att, decl.ownAdmittance, ctx.own); // prettier-ignore
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
      ? resonate(probePointEval(ctx.probe, section + 1), gridNa.freqs, gridNa, seriesExtract(built, section), built.settings.f0Hz, seriesLoopOnGrid(built, section, gridNa) ?? undefined) // prettier-ignore
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
    unloadedQ: res ? ownResonance(decl.ownImpedance, res.fr, ctx.own) : null,
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
): ResonatorFinding[] {
  const { built, topo, gridNa, probe } = ctx;
  const end = stage.firstSection + stage.sectionCount;
  const peak = pairPeak(built, gridNa, probe, stage, ctx.shapes);
  const segment = topo.segment[end];
  let peakLocal: number | null = null;
  if (peak) {
    probe.at(peak.peakHz, end);
    peakLocal = probe.fNode[end];
    ctx.claims.push({ segment, fr: peakLocal, bw: peak.bandwidthHz ?? 0 });
  }
  return decls.map((decl) => {
    const fig = coupledTank(built, gridNa, probe, stage, decl, ctx.own);
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

/**
 * Analyses every resonator the stages declare and every one the network shows.
 * @param sweepNa the sweep's node analysis, reused to bracket resonances when it spans the
 *   search range with enough points (else a search grid is analysed)
 * @param shapes where a coupled pair's response shape is kept when found on `sweepNa`
 * @param topo the chain's topology, when the caller has it already
 */
export function analyzeResonators(
  built: BuiltChain,
  sweepNa: NodeAnalysis | null = null,
  shapes?: ShapeMemo,
  topo: Topology = chainTopology(built),
): ResonatorFinding[] {
  const gridNa = bracketingGrid(built, sweepNa, (f) => runNodeAnalysis(built, f));
  const ctx: Context = { built, topo, gridNa, probe: probeOf(built), claims: [], own: new Map() }; // prettier-ignore
  // Shapes found on the sweep itself are the selectivity's too; a search grid's are not.
  if (shapes && gridNa === sweepNa) ctx.shapes = shapes;
  // Nodes inside or at the ends of a coupled pair belong to the pair.
  const claimed = pairClaims(built, topo);
  const declared: ResonatorFinding[] = [];
  for (const stage of built.twoPorts) {
    const decls = stage.model.resonators ?? [];
    const pair = pairDecls(stage);
    if (pair.length > 0) declared.push(...declaredPair(ctx, stage, pair));
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
