/**
 * Snap a stage's, or the whole chain's, component values to a preferred-number series and
 * show what it does: the response at the last node before and after, the shift of every
 * resonance and bandwidth, and the change in gain and noise figure.
 *
 * Nearest-value rule (see preferred-values.ts): the preferred value with the smallest
 * |ln(value/preferred)|, the larger one on an exact tie.
 */
import { analyzeChain } from '../analyze';
import type { AnalysisResult } from '../types';
import type { ChainDocument } from '../../schema/chain';
import {
  componentParams,
  definitionOf,
  numberValue,
  stageOf,
  type DesignOptions,
} from './chain-edit';
import { snapToSeries, type PreferredSeries } from './preferred-values';

export interface SnapRequest {
  series: PreferredSeries;
  /** Only this stage; the whole chain when absent. */
  stageId?: string;
}

export interface SnapChange {
  stageId: string;
  key: string;
  label: string;
  unit: string;
  before: number;
  after: number;
  changePercent: number;
}

export interface SnapFigures {
  totalGainDb: number;
  noiseFigureDb: number;
  peakHz: number | null;
  bw3dbHz: number | null;
}

export interface SnapResult {
  series: PreferredSeries;
  rule: string;
  document: ChainDocument;
  changes: SnapChange[];
  before: SnapFigures;
  after: SnapFigures;
  resonators: {
    stageId: string;
    label: string;
    beforeHz: number | null;
    afterHz: number | null;
    shiftHz: number | null;
    beforeBandwidthHz: number | null;
    afterBandwidthHz: number | null;
  }[];
  /**
   * Step-up before and after (at most 401 points) at the node of the first resonator with
   * one (where snapping moves the response most visibly), else at the last node.
   */
  response: { node: number; freqsHz: number[]; beforeDb: number[]; afterDb: number[] };
}

export const NEAREST_RULE =
  'nearest in ratio: the preferred value with the smallest |ln(value/preferred)| (IEC 60063 series); on an exact tie the larger';

function figures(r: AnalysisResult): SnapFigures {
  const last = r.selectivity[r.selectivity.length - 1];
  return {
    totalGainDb: r.levels.totalGainDb,
    noiseFigureDb: r.levels.noiseFigureDb,
    peakHz: last?.peakHz ?? null,
    bw3dbHz: last?.bw3dbHz ?? null,
  };
}

function nodeDb(r: AnalysisResult, node: number): number[] {
  return r.sweep?.nodes.find((n) => n.index === node)?.stepUpDb ?? [];
}

function thinIndex(n: number, max: number): number[] {
  if (n <= max) return Array.from({ length: n }, (_, i) => i);
  const step = (n - 1) / (max - 1);
  return Array.from({ length: max }, (_, i) => Math.round(i * step));
}

/** The snapped document and its changes, without analysing it. */
export function snapDocument(
  doc: ChainDocument,
  req: SnapRequest,
  options: DesignOptions = {},
): { document: ChainDocument; changes: SnapChange[] } {
  if (req.stageId) stageOf(doc, req.stageId);
  const changes: SnapChange[] = [];
  const stages = doc.stages.map((stage) => {
    if (req.stageId && stage.id !== req.stageId) return stage;
    const values = { ...stage.values };
    for (const p of componentParams(stage, definitionOf(stage, options))) {
      const before = numberValue(stage, p);
      if (!(before > 0)) continue;
      const after = snapToSeries(before, req.series);
      values[p.key] = after;
      if (after !== before) {
        changes.push({
          stageId: stage.id,
          key: p.key,
          label: p.label,
          unit: p.unit,
          before,
          after,
          changePercent: ((after - before) / before) * 100,
        });
      }
    }
    // What the user typed no longer describes a snapped value.
    const entered = stage.entered as Record<string, string> | undefined;
    const kept = entered
      ? Object.fromEntries(Object.entries(entered).filter(([k]) => values[k] === stage.values[k]))
      : undefined;
    return { ...stage, values, ...(entered ? { entered: kept } : {}) };
  });
  return { document: { ...doc, stages }, changes };
}

/** Snaps and analyses before and after. */
export function snapChain(
  doc: ChainDocument,
  req: SnapRequest,
  options: DesignOptions = {},
): SnapResult {
  const { document, changes } = snapDocument(doc, req, options);
  const before = analyzeChain(doc, { ...options, sweep: true });
  const after = analyzeChain(document, { ...options, sweep: true });
  const idx = thinIndex(before.sweep?.freqsHz.length ?? 0, 401);
  const node = before.resonators.find((r) => r.node !== null)?.node ?? before.nodes.length - 1;
  const bDb = nodeDb(before, node);
  const aDb = nodeDb(after, node);
  return {
    series: req.series,
    rule: NEAREST_RULE,
    document,
    changes,
    before: figures(before),
    after: figures(after),
    resonators: before.resonators.map((r) => {
      const a = after.resonators.find((x) => x.stageId === r.stageId && x.label === r.label);
      const afterHz = a?.resonanceHz ?? null;
      return {
        stageId: r.stageId,
        label: r.label,
        beforeHz: r.resonanceHz,
        afterHz,
        shiftHz: afterHz !== null && r.resonanceHz !== null ? afterHz - r.resonanceHz : null,
        beforeBandwidthHz: r.bandwidthHz,
        afterBandwidthHz: a?.bandwidthHz ?? null,
      };
    }),
    response: {
      node,
      freqsHz: idx.map((i) => before.sweep!.freqsHz[i]),
      beforeDb: idx.map((i) => bDb[i]),
      afterDb: idx.map((i) => aDb[i]),
    },
  };
}
