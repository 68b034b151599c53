/**
 * A Monte Carlo trial's figures computed for what the study reports and nothing else.
 *
 * The nominal chain is analysed in full once (its resonators found on a grid, every node's
 * selectivity, flags). A trial changes values by a few per cent, so each tuned circuit the
 * nominal analysis reported is followed, not searched for again: its resonance is re-located
 * from the nominal one by single-frequency evaluations stepping outward until the
 * susceptance changes sign (no bracketing grid over the whole chain), then refined and
 * measured exactly as the full analysis does. Only the judged node's selectivity, the gain
 * and the noise figure are worked out; nothing else the full analysis reports (flags,
 * unloaded Q, other nodes, the sweep arrays) is.
 *
 * A trial therefore gives the figures a full analysis of the drawn chain gives, resonator by
 * resonator of the nominal list (test/engine/studies-trial.test.ts compares the two).
 */
import type { ChainDocument } from '../../schema/chain';
import { buildChain, type BuiltChain } from '../core/build';
import { probePointEval, resonateNear, seriesExtract } from '../core/extract-resonance';
import { settleLoadLevel } from '../core/load-level';
import { runNodeAnalysis, sharedWorkspace } from '../core/nodes';
import { createProbe, type Probe } from '../core/probe';
import { chainNoiseFigureDb, stageReports } from '../core/reports';
import type { ResonatorFinding } from '../core/resonators';
import { analyzeSelectivity, findMixer, imageFrequency } from '../core/selectivity';
import { loopAt, seriesFigures, seriesSections } from '../core/found-series';
import { frequencyGrid } from '../core/sweep';
import { chainTopology } from '../core/topology';
import { defaultCatalogue } from '../default-catalogue';
import type { MeasuredNetwork, ResonatorDecl } from '../types';
import { followCoupledTank } from './coupled-follow';
import { followShunt, resonanceNearPredicted } from './shunt-follow';
import { createJudgedSweep, judgedSelectivity, type JudgedSweep } from './judged-sweep';

const finiteOrNull = (v: number | null | undefined): number | null =>
  v === null || v === undefined || !Number.isFinite(v) ? null : v;

/** How a nominal resonator is followed in a trial. */
type Follow =
  | { how: 'none' }
  /** A shunt tank (declared alone, or found): the node's total admittance at `flat`. */
  | { how: 'shunt'; flat: number; fIn: number; sign: number }
  /** One tank of a declared coupled pair. */
  | { how: 'coupled'; stageId: string; label: string; fIn: number; sign: number }
  /** A declared series resonator. */
  | { how: 'series'; stageId: string; label: string; fIn: number; sign: number }
  /** A found series resonance: the loop at the first section of its series run, `flat`. */
  | { how: 'loop'; flat: number; fIn: number; sign: number };

/** What a trial follows, fixed from the nominal analysis. */
export interface TrialTracker {
  /** The nominal chain as built (before its load level is settled): what trials build like. */
  nominal: BuiltChain;
  follow: Follow[];
  /** User-level node whose selectivity the study judges. */
  node: number;
}

/** +1 when the frequency at `flat` rises with the input frequency near fIn, else −1. */
function orientationAt(probe: Probe, flat: number, fIn: number): number {
  probe.at(fIn, flat);
  const f = probe.fNode[flat];
  probe.at(fIn * (1 + 1e-6), flat);
  return probe.fNode[flat] >= f ? 1 : -1;
}

/**
 * The tracker of a nominal chain.
 * @param nominal the nominal chain as built
 * @param findings its resonators in report order (analyzeResonators on the settled chain);
 *   an undefined entry is one not to follow (its figures stay null)
 */
export function trialTracker(
  nominal: BuiltChain,
  findings: readonly (ResonatorFinding | undefined)[],
  node: number,
): TrialTracker {
  const built = settleLoadLevel(nominal);
  const probe = createProbe(built);
  const follow = findings.map((r): Follow => {
    if (!r || r.fIn === null || !Number.isFinite(r.fIn)) return { how: 'none' };
    const fIn = r.fIn;
    if (r.kind === 'series' && r.origin === 'found') {
      return { how: 'loop', flat: r.flat, fIn, sign: orientationAt(probe, r.flat, fIn) };
    }
    if (r.kind === 'series') {
      const sign = orientationAt(probe, r.flat, fIn);
      return { how: 'series', stageId: r.stageId, label: r.label, fIn, sign };
    }
    const sign = orientationAt(probe, r.flat, fIn);
    if (r.origin === 'declared' && r.pairPeakHz !== undefined) {
      return { how: 'coupled', stageId: r.stageId, label: r.label, fIn, sign };
    }
    return { how: 'shunt', flat: r.flat, fIn, sign };
  });
  return { nominal, follow, node };
}

/** The declaration `label` of stage `stageId` in a built chain, with the stage. */
function declOf(built: BuiltChain, stageId: string, label: string) {
  const stage = built.twoPorts.find((s) => s.id === stageId);
  const decl = stage?.model.resonators?.find((d) => d.label === label);
  return stage && decl ? { stage, decl } : null;
}

/** What following one resonator gives (all null when it was not found). */
export interface FollowedResonator {
  /** Input frequency where it was found, Hz: where the next follow starts. */
  fIn: number | null;
  resonanceHz: number | null;
  loadedQ: number | null;
  loadingRatio: number | null;
}

const NOT_FOUND: FollowedResonator = { fIn: null, resonanceHz: null, loadedQ: null, loadingRatio: null }; // prettier-ignore

function found(
  fIn: number,
  fr: number,
  q: number | null,
  loading: number | null,
): FollowedResonator {
  return { fIn, resonanceHz: fr, loadedQ: q, loadingRatio: loading };
}

/** One followed resonator in a built chain. */
function followed(
  built: BuiltChain,
  probe: Probe,
  topo: ReturnType<typeof chainTopology>,
  f: Follow,
): FollowedResonator {
  switch (f.how) {
    case 'none':
      return NOT_FOUND;
    case 'shunt': {
      const tank = followShunt(built, topo, probe, f.flat, f.fIn, f.sign);
      return tank ? found(tank.fIn, tank.fr, tank.loadedQ, tank.loadingRatio) : NOT_FOUND;
    }
    case 'loop': {
      const scratch = new Float64Array(2);
      const att = resonanceNearPredicted(probe, f.flat, f.fIn, f.sign, loopAt, scratch);
      if (!att) return NOT_FOUND;
      const fig = seriesFigures(built, seriesSections(built), probe, null, f.flat, att);
      return found(att.fIn, att.fr, fig.loadedQ, fig.loadingRatio);
    }
    case 'series': {
      const decl = declOf(built, f.stageId, f.label);
      if (!decl || decl.decl.kind !== 'series') return NOT_FOUND;
      const section = decl.stage.firstSection + decl.decl.section;
      const at = probePointEval(probe, section + 1);
      const res = resonateNear(at, seriesExtract(built, section), f.fIn, f.sign);
      return res ? found(res.fIn, res.fr, finiteOrNull(res.q), null) : NOT_FOUND;
    }
    case 'coupled': {
      const d = declOf(built, f.stageId, f.label);
      if (!d || d.decl.kind !== 'shunt') return NOT_FOUND;
      const { stage } = d;
      const decl = d.decl as ResonatorDecl & { kind: 'shunt' };
      const first = decl.coupledPartner === 'downstream';
      const flat = first ? stage.firstSection : stage.firstSection + stage.sectionCount;
      const tank = followCoupledTank(built, probe, flat, decl.ownAdmittance, f.fIn, f.sign);
      if (!tank) return NOT_FOUND;
      const qA = tank.loadedQ;
      // The first tank is damped by its partner on purpose: no loading ratio (coupled-pair.ts).
      if (first || qA === null) return found(tank.fIn, tank.fr, qA, null);
      const qD = tank.detachedQ;
      return found(tank.fIn, tank.fr, qA, qD ? qA / qD : null);
    }
  }
}

/** Every resonator of the tracker followed in a built chain (load level settled). */
export function followResonators(
  built: BuiltChain,
  tracker: TrialTracker,
  probe: Probe = createProbe(built),
): FollowedResonator[] {
  const topo = chainTopology(built);
  return tracker.follow.map((f) => followed(built, probe, topo, f));
}

/** The tracker moved to where its resonators were last found (a band study's next step). */
export function movedTracker(
  tracker: TrialTracker,
  at: readonly FollowedResonator[],
): TrialTracker {
  const follow = tracker.follow.map((f, i): Follow => {
    const fIn = at[i]?.fIn;
    return f.how === 'none' || fIn === null || fIn === undefined ? f : { ...f, fIn };
  });
  return { ...tracker, follow };
}

/** What a study reads at its judged node and of the whole chain. */
export interface JudgedFigures {
  peakHz: number | null;
  bw3dbHz: number | null;
  imageRejectionDb: number | null;
  gainDb: number | null;
  noiseFigureDb: number | null;
}

/** Gain and noise figure of the whole chain at f0. */
function levelFigures(built: BuiltChain): Pick<JudgedFigures, 'gainDb' | 'noiseFigureDb'> {
  const f0Na = runNodeAnalysis(built, [built.settings.f0Hz], sharedWorkspace('trial-f0', built, 1)); // prettier-ignore
  const stages = stageReports(built, f0Na);
  const last = stages[stages.length - 1];
  return {
    gainDb: last ? finiteOrNull(last.cumulativeGainDb) : 0,
    noiseFigureDb: finiteOrNull(chainNoiseFigureDb(built, f0Na, stages)),
  };
}

/** Peak, −3 dB width and image rejection at user node `node`, gain and noise figure. */
export function judgedFigures(built: BuiltChain, node: number): JudgedFigures {
  const grid = frequencyGrid(built.settings.sweep);
  const sweepNa = runNodeAnalysis(built, grid, sharedWorkspace('trial', built, grid.length));
  const image = imageFrequency(built, findMixer(built));
  const sel = analyzeSelectivity(built, sweepNa, image, node)[0];
  return {
    peakHz: finiteOrNull(sel?.peakHz),
    bw3dbHz: finiteOrNull(sel?.bw3dbHz),
    imageRejectionDb: finiteOrNull(sel?.imageRejectionDb),
    ...levelFigures(built),
  };
}

/** The judged-node sweep of each nominal chain trials are built like (made at the first trial). */
const judgedSweeps = new WeakMap<BuiltChain, JudgedSweep>();

function judgedSweepOf(nominal: BuiltChain): JudgedSweep {
  let sweep = judgedSweeps.get(nominal);
  if (!sweep) {
    sweep = createJudgedSweep(nominal, frequencyGrid(nominal.settings.sweep));
    judgedSweeps.set(nominal, sweep);
  }
  return sweep;
}

/**
 * The metric row of one drawn chain (the order of metricList: per resonator resonance,
 * loaded Q and loading ratio; then the judged node's peak and −3 dB width, gain, noise
 * figure and image rejection).
 * @throws ChainValidationError when a drawn value is out of its stage's range
 */
export function trialMetrics(
  doc: ChainDocument,
  tracker: TrialTracker,
  dataFiles?: Readonly<Record<string, MeasuredNetwork>>,
): (number | null)[] {
  const like = tracker.nominal;
  return builtTrialMetrics(buildChain(doc, defaultCatalogue(), { dataFiles, like }), tracker);
}

/** The metric row of a drawn chain already built (like the tracker's nominal). */
export function builtTrialMetrics(drawn: BuiltChain, tracker: TrialTracker): (number | null)[] {
  const like = tracker.nominal;
  const built = settleLoadLevel(drawn);
  const probe = createProbe(built);
  const row: (number | null)[] = [];
  for (const r of followResonators(built, tracker, probe)) {
    row.push(r.resonanceHz, r.loadedQ, r.loadingRatio);
  }
  // The drawn chain shares the nominal's settings object when its settings are the same.
  const image = imageFrequency(built, findMixer(built));
  const j =
    built.settings === like.settings
      ? {
          ...judgedSelectivity(built, judgedSweepOf(like), probe, tracker.node, image),
          ...levelFigures(built),
        }
      : judgedFigures(built, tracker.node);
  row.push(j.peakHz, j.bw3dbHz, j.gainDb, j.noiseFigureDb, j.imageRejectionDb);
  return row;
}
