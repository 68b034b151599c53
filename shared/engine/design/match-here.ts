/**
 * Match here: every matching network that exists between two stages of a chain, for the
 * impedances the chain really presents at that node at f0 (or typed ones). Each candidate
 * is turned into stage instances, inserted, and the whole chain analysed again, so what the
 * designer reads (return loss, gain, noise figure, selectivity) is the chain's own answer.
 */
import { analyzeChain } from '../analyze';
import { defaultCatalogue } from '../default-catalogue';
import { hasModes, modeView } from '../modes/apply-mode';
import { formatDesignResult } from '../core/format';
import { StageParameterError } from '../errors';
import type { ComplexJson } from '../types';
import type { ChainDocument, StageInstance } from '../../schema/chain';
import type { DesignOptions } from './chain-edit';
import {
  absorbIntoPi,
  absorbIntoT,
  complexLSections,
  coupledCoilsMatch,
  parallelForm,
  type LadderPart,
} from './complex-match';
import { designPi, designT } from './match-design';
import { designTappedCapacitor } from './tapped-capacitor';
import { ladderStages, type PartsQ } from './match-stages';

export interface MatchHereRequest {
  /** Insert after this stage (0 = the source); the node between it and the next. */
  afterStageId: string;
  /** Design frequency, Hz; default: the chain's f0 at this node. */
  fHz?: number;
  /** Impedance looking back to the source; default: the chain's at f0. */
  zSource?: ComplexJson;
  /** Impedance looking on toward the load; default: the chain's at f0. */
  zLoad?: ComplexJson;
  /** Loaded Q for the pi, T and tapped-C (default 10) and the coupled coils' secondary. */
  q?: number;
  /** Coupling of the coupled-coils candidate (default 0.5). */
  k?: number;
  /** Capacitance already across port 2 (a device's input), F: absorbed into the design. */
  parasiticC?: number;
  /** Q of the parts the inserted stages get (default coil 200, capacitor 1000). */
  partsQ?: Partial<PartsQ>;
}

export type MatchTopology = 'l-section' | 'pi' | 't' | 'double-l' | 'tapped-c' | 'coupled-coils';

/** Whole-chain figures with a candidate inserted. */
export interface InsertedFigures {
  returnLossDb: number;
  mismatchLossDb: number;
  totalGainDb: number;
  noiseFigureDb: number;
  /** At the last node. */
  peakHz: number | null;
  bw3dbHz: number | null;
  /** −3 dB width at the network's output node. */
  networkBw3dbHz: number | null;
  /** Step-up at the network's output node over the sweep (at most 201 points). */
  response: { freqsHz: number[]; stepUpDb: number[] };
}

export interface MatchCandidate {
  id: string;
  topology: MatchTopology;
  title: string;
  parts: LadderPart[];
  /** Highest nodal Q of the design (what sets its bandwidth and the parts' Q needed). */
  loadedQ: number;
  /** Extra values (coupled coils' L1, L2, k). */
  extra?: Record<string, number>;
  stages: StageInstance[];
  figures: InsertedFigures | null;
  /** Why the whole-chain analysis failed, when it did. */
  error?: string;
}

export interface MatchHereResult {
  fHz: number;
  zSource: ComplexJson;
  zLoad: ComplexJson;
  /** The node's figures before any network is inserted. */
  before: { returnLossDb: number; totalGainDb: number; noiseFigureDb: number };
  candidates: MatchCandidate[];
  /** Topologies that do not exist here, each with the reason (e.g. the minimum Q). */
  refused: { topology: MatchTopology; reason: string }[];
}

function describe(parts: LadderPart[]): string {
  return parts.map((p) => `${p.place} ${p.part}`).join(', ');
}

/** Stage ids not yet used in the chain: `${base}-1`, `${base}-2`, … */
function idMaker(doc: ChainDocument, base: string): () => string {
  const used = new Set(doc.stages.map((s) => s.id));
  let n = 0;
  return () => {
    let id: string;
    do id = `${base}-${++n}`;
    while (used.has(id));
    used.add(id);
    return id;
  };
}

/** The chain with `stages` inserted after stage index `at`. */
export function insertStages(
  doc: ChainDocument,
  at: number,
  stages: StageInstance[],
): ChainDocument {
  return {
    ...doc,
    stages: [...doc.stages.slice(0, at + 1), ...stages, ...doc.stages.slice(at + 1)],
  };
}

function thin(values: number[], max: number): number[] {
  if (values.length <= max) return values;
  const step = (values.length - 1) / (max - 1);
  return Array.from({ length: max }, (_, i) => values[Math.round(i * step)]);
}

function figuresFor(
  doc: ChainDocument,
  at: number,
  count: number,
  options: DesignOptions,
): InsertedFigures {
  const r = analyzeChain(doc, { ...options, sweep: true });
  const node = r.nodes[at];
  const out = at + count;
  const sweepNode = r.sweep?.nodes.find((n) => n.index === out);
  const last = r.selectivity[r.selectivity.length - 1];
  return {
    returnLossDb: node.matchReturnLossDb,
    mismatchLossDb: node.mismatchLossDb,
    totalGainDb: r.levels.totalGainDb,
    noiseFigureDb: r.levels.noiseFigureDb,
    peakHz: last?.peakHz ?? null,
    bw3dbHz: last?.bw3dbHz ?? null,
    networkBw3dbHz: r.selectivity[out]?.bw3dbHz ?? null,
    response: {
      freqsHz: thin(r.sweep?.freqsHz ?? [], 201),
      stepUpDb: thin(sweepNode?.stepUpDb ?? [], 201),
    },
  };
}

function refusal(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

/**
 * Lists every matching network for the node after `afterStageId`, each analysed in place.
 * @throws StageParameterError when the node is not between two stages or the impedances
 *   have no positive resistance.
 */
export function matchHere(
  doc: ChainDocument,
  req: MatchHereRequest,
  options: DesignOptions = {},
): MatchHereResult {
  if (hasModes(doc) || options.mode !== undefined) {
    // Design in the mode's own chain (its path, its values); insert with insertStagesAfter.
    const view = modeView(doc, options.mode, options.catalogue ?? defaultCatalogue());
    return matchHere(view.doc, req, { ...options, mode: undefined });
  }
  const at = doc.stages.findIndex((s) => s.id === req.afterStageId);
  if (at < 0 || at >= doc.stages.length - 1) {
    throw new StageParameterError(
      'afterStageId',
      `"${req.afterStageId}" is not a stage with another after it: pick the stage the network should follow`,
    );
  }
  const base = analyzeChain(doc, { ...options, sweep: false });
  const node = base.nodes[at];
  const fHz = req.fHz ?? (at === 0 ? base.f0Hz : base.stages[at - 1].fOutHz);
  if (!(fHz > 0) || !Number.isFinite(fHz)) {
    throw new StageParameterError('fHz', `the design frequency must be above 0 Hz (got ${fHz})`);
  }
  const zs = req.zSource ?? node.zSrc;
  const zl = req.zLoad ?? node.zIn;
  for (const [name, z] of [
    ['zSource', zs],
    ['zLoad', zl],
  ] as const) {
    if (!(z.re > 0) || !Number.isFinite(z.re) || !Number.isFinite(z.im)) {
      throw new StageParameterError(
        name,
        `${name === 'zSource' ? 'the source side' : 'the load side'} presents ${z.re} ${z.im >= 0 ? '+' : '−'} j${Math.abs(z.im)} Ω: a match needs a resistance above 0 Ω on both sides`,
      );
    }
  }
  const q = req.q ?? 10;
  const k = req.k ?? 0.5;
  // A stated parasitic sits across port 2: it becomes part of the load.
  const zLoad = addShuntC(zl, req.parasiticC ?? 0, fHz);
  const partsQ: PartsQ = { ql: req.partsQ?.ql ?? 200, qc: req.partsQ?.qc ?? 1000 };
  const nextId = idMaker(doc, 'match');
  const designs: Omit<MatchCandidate, 'stages' | 'figures' | 'id'>[] = [];
  const refused: MatchHereResult['refused'] = [];
  const s = parallelForm(zs);
  const l = parallelForm(zLoad);

  complexLSections(zs, zLoad, fHz).forEach((d) =>
    designs.push({
      topology: 'l-section',
      title: `L-section: ${describe(d.parts)}`,
      parts: d.parts,
      loadedQ: d.q,
    }),
  );
  tryDesign('pi', refused, () => {
    const d = designPi({ r1: s.r, r2: l.r, f0: fHz, q });
    const { c1, l: lPi, c2 } = d.values;
    const parts = absorbIntoPi({ c1, l: lPi, c2 }, zs, zLoad, fHz);
    designs.push({ topology: 'pi', title: `Pi, Q ${q}: ${describe(parts)}`, parts, loadedQ: d.q });
  });
  tryDesign('t', refused, () => {
    const d = designT({ r1: zs.re, r2: zLoad.re, f0: fHz, q });
    const { l1, c, l2 } = d.values;
    const parts = absorbIntoT({ l1, c, l2 }, zs, zLoad, fHz);
    designs.push({ topology: 't', title: `T, Q ${q}: ${describe(parts)}`, parts, loadedQ: d.q });
  });
  tryDesign('double-l', refused, () => {
    const rm = Math.sqrt(zs.re * zLoad.re);
    const first = lowestQ(complexLSections(zs, { re: rm, im: 0 }, fHz));
    const second = lowestQ(complexLSections({ re: rm, im: 0 }, zLoad, fHz));
    const parts = [...first.parts, ...second.parts];
    designs.push({
      topology: 'double-l',
      title: `Two L-sections through ${formatDesignResult(rm)} Ω: ${describe(parts)}`,
      parts,
      loadedQ: Math.max(first.q, second.q),
    });
  });
  tryDesign('tapped-c', refused, () => designs.push(tappedC(zs, zLoad, fHz, q)));
  tryDesign('coupled-coils', refused, () => {
    const m = coupledCoilsMatch(zs, zLoad, fHz, k, q);
    const parts = [m.series, m.shunt].filter((p): p is LadderPart => p !== null);
    designs.push({
      topology: 'coupled-coils',
      title: `Coupled coils, k ${k}, tuned secondary: ${describe(parts)}`,
      parts,
      loadedQ: q,
      extra: { l1: m.l1, l2: m.l2, k },
    });
  });

  const candidates = designs.map((d) => {
    const stages = ladderStages(d, partsQ, nextId);
    const id = stages[0].id;
    try {
      return {
        ...d,
        id,
        stages,
        figures: figuresFor(insertStages(doc, at, stages), at, stages.length, options),
      };
    } catch (e) {
      return { ...d, id, stages, figures: null, error: refusal(e) };
    }
  });
  return {
    fHz,
    zSource: zs,
    zLoad,
    before: {
      returnLossDb: node.matchReturnLossDb,
      totalGainDb: base.levels.totalGainDb,
      noiseFigureDb: base.levels.noiseFigureDb,
    },
    candidates,
    refused,
  };
}

function tryDesign(topology: MatchTopology, refused: MatchHereResult['refused'], run: () => void) {
  try {
    run();
  } catch (e) {
    refused.push({ topology, reason: refusal(e) });
  }
}

function lowestQ<T extends { q: number }>(list: T[]): T {
  if (list.length === 0) {
    throw new StageParameterError('zLoad', 'no L-section exists for one of the two steps');
  }
  return list.reduce((a, b) => (b.q < a.q ? b : a));
}

function addShuntC(z: ComplexJson, c: number, f: number): ComplexJson {
  if (!(c > 0)) return z;
  const m = z.re * z.re + z.im * z.im;
  const y = { re: z.re / m, im: -z.im / m + 2 * Math.PI * f * c };
  const n = y.re * y.re + y.im * y.im;
  return { re: y.re / n, im: -y.im / n };
}

/**
 * Tapped-capacitor transformer with the tank across the higher parallel resistance. The
 * terminations' susceptances are taken out of the tank L (top) and C2 (tap) ends.
 */
function tappedC(zs: ComplexJson, zl: ComplexJson, f: number, q: number) {
  const s = parallelForm(zs);
  const l = parallelForm(zl);
  const tankAtPort1 = s.r > l.r;
  const [top, tap] = tankAtPort1 ? [s, l] : [l, s];
  const d = designTappedCapacitor({ r1: top.r, r2: tap.r, f0: f, q });
  const w = 2 * Math.PI * f;
  const topB = -1 / (w * d.values.l) - top.b;
  const tapB = w * d.values.c2 - tap.b;
  const topPart: LadderPart =
    topB < 0
      ? { place: 'shunt', part: 'L', value: -1 / (w * topB) }
      : { place: 'shunt', part: 'C', value: topB / w };
  const tapPart: LadderPart =
    tapB > 0
      ? { place: 'shunt', part: 'C', value: tapB / w }
      : { place: 'shunt', part: 'L', value: -1 / (w * tapB) };
  const c1: LadderPart = { place: 'series', part: 'C', value: d.values.c1 };
  const parts = tankAtPort1 ? [topPart, c1, tapPart] : [tapPart, c1, topPart];
  return {
    topology: 'tapped-c' as const,
    title: `Tapped capacitor, Q ${q}, tank on the ${tankAtPort1 ? 'source' : 'load'} side: ${describe(parts)}`,
    parts,
    loadedQ: q,
  };
}
