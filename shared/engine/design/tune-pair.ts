/**
 * Tune the pair: solve a two-tank coupled bandpass (both tanks' L and C, and the coupling)
 * for a centre frequency, a −3 dB bandwidth and a shape (k·Q; 1 = critical coupling).
 *
 * Start: for two identical tanks of loaded Q coupled at k·Q = η, the −3 dB bandwidth is
 * BW = (f0/Q)·√(η² − 1 + √(2(η⁴ + 1))) (√2·f0/Q at critical coupling; the standard
 * double-tuned result, stated from memory), so Q = f0·F(η)/BW and k = η/Q. A tank loaded by
 * a fixed resistance has Q = R/(ωL), so L scales by Q_now/Q_wanted and C inversely.
 * Answer: the chain's own response. Each round solves C so the tanks resonate at f0 on the
 * chain (tuneResonator), measures the −3 dB width at the stage's output node with edges
 * refined by bisection, rescales L by BW_wanted/BW_measured and sets k from the first tank's
 * Q with its partner detached, as the chain reports it.
 */
import { runNodeAnalysis } from '../core/nodes';
import { StageParameterError } from '../errors';
import type { ChainDocument } from '../../schema/chain';
import { buildDoc, stageOf, type DesignOptions } from './chain-edit';
import { findResonator, tuneResonator } from './tune';

export interface TunePairRequest {
  stageId: string;
  targetHz: number;
  bandwidthHz: number;
  /** k·Q (1 = critical coupling, the default; above 1 gives a double hump). */
  kq?: number;
}

export interface TunePairResult {
  values: { l: number; c: number; k?: number; cc?: number };
  /** The start from the closed form, and the formula. */
  start: { l: number; c: number; q: number; k: number; formula: string };
  resonanceHz: number;
  loadedQ: number | null;
  /** The first tank's Q with only its own termination (what k·Q is taken against). */
  tankQ: number | null;
  bandwidthHz: number;
  lowEdgeHz: number;
  highEdgeHz: number;
  rounds: number;
  document: ChainDocument;
}

/** F(η) in BW = f0·F(η)/Q. */
export function pairBandwidthFactor(kq: number): number {
  return Math.sqrt(kq * kq - 1 + Math.sqrt(2 * (kq ** 4 + 1)));
}

/**
 * The −3 dB edges of the step-up at user node `node` around `centreHz`: a grid brackets
 * them, bisection refines them to 1e-9 relative.
 */
export function passBandEdges(
  doc: ChainDocument,
  node: number,
  centreHz: number,
  spanHz: number,
  options: DesignOptions = {},
): { low: number; high: number; peakHz: number } {
  const built = buildDoc(doc, options);
  const flat = built.userNodeFlat[node];
  const db = (freqs: number[]) => {
    const na = runNodeAnalysis(built, freqs);
    return freqs.map((_, i) => {
      const k = flat * na.points + i;
      return 20 * Math.log10(Math.hypot(na.vRe[k], na.vIm[k]) / na.emf[i]);
    });
  };
  const lo = Math.max(centreHz - spanHz, centreHz * 0.01);
  const n = 601;
  const grid = Array.from({ length: n }, (_, i) => lo + ((centreHz + spanHz - lo) * i) / (n - 1));
  const v = db(grid);
  let p = 0;
  for (let i = 1; i < n; i++) if (v[i] > v[p]) p = i;
  const level = v[p] - 10 * Math.log10(2);
  const edge = (from: number, step: 1 | -1) => {
    let i = from;
    while (i + step >= 0 && i + step < n && v[i + step] > level) i += step;
    if (i + step < 0 || i + step >= n) {
      throw new StageParameterError('bandwidthHz', 'the pass band is wider than the search span');
    }
    let a = grid[i];
    let b = grid[i + step];
    for (let it = 0; it < 60 && Math.abs(b - a) > 1e-10 * centreHz; it++) {
      const m = 0.5 * (a + b);
      if (db([m])[0] > level) a = m;
      else b = m;
    }
    return 0.5 * (a + b);
  };
  return { low: edge(p, -1), high: edge(p, 1), peakHz: grid[p] };
}

/** Solves a coupled bandpass stage for centre, bandwidth and shape on the chain. */
export function tunePair(
  doc: ChainDocument,
  req: TunePairRequest,
  options: DesignOptions = {},
): TunePairResult {
  const stage = stageOf(doc, req.stageId);
  if (stage.type !== 'coupled-bandpass') {
    throw new StageParameterError(
      'stageId',
      `stage "${stage.id}" is not a two-tank coupled bandpass`,
    );
  }
  const { targetHz, bandwidthHz } = req;
  if (!(targetHz > 0) || !(bandwidthHz > 0) || bandwidthHz >= targetHz / 2) {
    throw new StageParameterError(
      'bandwidthHz',
      'the target and the bandwidth must be above 0 Hz, the bandwidth below half the target',
    );
  }
  const kq = req.kq ?? 1;
  const topC = stage.values.coupling === 'top-c';
  const tank = { stageId: stage.id, label: 'first tank' };
  const node = doc.stages.indexOf(stage);
  const l0 = Number(stage.values.l ?? 1e-6);
  const c0 = Number(stage.values.c ?? 250e-12);
  const found = findResonator(doc, tank, options);
  // The first tank's Q with only its own termination (its partner detached) is the Q the
  // double-tuned formulas mean.
  const q0 = found?.detachedQ ?? 50;
  const qWanted = (targetHz * pairBandwidthFactor(kq)) / bandwidthHz;
  const f0Now = found?.resonanceHz ?? targetHz;
  let l = (l0 * q0) / qWanted;
  let c = (c0 * l0) / l / (targetHz / f0Now) ** 2;
  const start = {
    l,
    c,
    q: qWanted,
    k: kq / qWanted,
    formula: 'BW = (f0/Q)·√(η² − 1 + √(2(η⁴ + 1))), η = k·Q; critical coupling η = 1 gives √2·f0/Q',
  };
  let k = kq / qWanted;
  const coupling = (kk: number, cTank: number): Record<string, number> =>
    topC ? { cc: (kk * cTank) / (1 - kk) } : { k: kk };
  let current = doc;
  let measured = { low: 0, high: 0, peakHz: 0 };
  let rounds = 0;
  let tankQ: number | null = null;
  // Secant on ln BW against ln L; BW ∝ L only while the coil's own loss is small, so the
  // slope is measured rather than assumed after the first round.
  let prev: { lnL: number; lnBw: number } | null = null;
  for (; rounds < 10; rounds++) {
    current = withStage(doc, stage.id, { l, c, ...coupling(k, c) });
    const tuned = tuneResonator(
      current,
      { resonator: tank, element: { stageId: stage.id, key: 'c' }, targetHz },
      options,
    );
    c = tuned.value;
    current = withStage(doc, stage.id, { l, c, ...coupling(k, c) });
    tankQ = findResonator(current, tank, options)?.detachedQ ?? null;
    measured = passBandEdges(current, node, targetHz, 4 * bandwidthHz, options);
    const lnBw = Math.log(measured.high - measured.low);
    const miss = Math.log(bandwidthHz) - lnBw;
    const shapeMiss = tankQ ? Math.abs(k * tankQ - kq) / kq : 0;
    if (Math.abs(miss) < 2e-3 && shapeMiss < 1e-2) break;
    let slope = prev ? (lnBw - prev.lnBw) / (Math.log(l) - prev.lnL) : 1;
    if (!(slope > 0.2 && slope < 5)) slope = 1;
    prev = { lnL: Math.log(l), lnBw };
    const scale = Math.exp(miss / slope);
    l *= scale;
    c /= scale;
    if (tankQ) k = kq / tankQ;
  }
  const final = findResonator(current, tank, options);
  const v = stageOf(current, stage.id).values;
  return {
    values: {
      l: Number(v.l),
      c: Number(v.c),
      ...(topC ? { cc: Number(v.cc) } : { k: Number(v.k) }),
    },
    start,
    resonanceHz: final?.resonanceHz ?? NaN,
    loadedQ: final?.loadedQ ?? null,
    tankQ: final?.detachedQ ?? tankQ,
    bandwidthHz: measured.high - measured.low,
    lowEdgeHz: measured.low,
    highEdgeHz: measured.high,
    rounds: rounds + 1,
    document: current,
  };
}

function withStage(doc: ChainDocument, id: string, values: Record<string, number>): ChainDocument {
  return {
    ...doc,
    stages: doc.stages.map((s) => (s.id === id ? { ...s, values: { ...s.values, ...values } } : s)),
  };
}
