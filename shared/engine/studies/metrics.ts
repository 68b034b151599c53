/**
 * The figures a study reads from one analysis: every tuned circuit's resonance, loaded Q and
 * loading ratio, and at the judged node the peak, −3 dB width, gain, noise figure and image
 * rejection. A figure the analysis could not give (a circuit not found) is null.
 */
import type { ChainTargets } from '../../schema/chain';
import type { AnalysisResult } from '../types';

export type MetricUnit = 'hertz' | 'ratio' | 'db';

export interface MetricInfo {
  key: string;
  label: string;
  unit: MetricUnit;
}

/** The metric list for a chain, from its nominal analysis (resonators in report order). */
export function metricList(nominal: AnalysisResult, node: number): MetricInfo[] {
  const list: MetricInfo[] = [];
  nominal.resonators.forEach((r, i) => {
    const name = r.label || r.stageId;
    list.push({ key: `fr:${i}`, label: `${name}: resonance`, unit: 'hertz' });
    list.push({ key: `q:${i}`, label: `${name}: loaded Q`, unit: 'ratio' });
    list.push({ key: `loading:${i}`, label: `${name}: loading ratio`, unit: 'ratio' });
  });
  list.push({ key: 'peak', label: `Node ${node}: peak`, unit: 'hertz' });
  list.push({ key: 'bandwidth', label: `Node ${node}: −3 dB width`, unit: 'hertz' });
  list.push({ key: 'gain', label: 'Gain', unit: 'db' });
  list.push({ key: 'nf', label: 'Noise figure', unit: 'db' });
  list.push({ key: 'image', label: 'Image rejection', unit: 'db' });
  return list;
}

const orNull = (v: number | null | undefined): number | null =>
  v === null || v === undefined || !Number.isFinite(v) ? null : v;

/** Reads the metrics of `metricList` (same order) from one analysis. */
export function readMetrics(
  result: AnalysisResult,
  node: number,
  resonatorCount: number,
): (number | null)[] {
  const row: (number | null)[] = [];
  for (let i = 0; i < resonatorCount; i++) {
    const r = result.resonators[i];
    row.push(orNull(r?.resonanceHz), orNull(r?.loadedQ), orNull(r?.loadingRatio));
  }
  const sel = result.selectivity.find((s) => s.node === node);
  row.push(
    orNull(sel?.peakHz),
    orNull(sel?.bw3dbHz),
    orNull(result.levels.totalGainDb),
    orNull(result.levels.noiseFigureDb),
    orNull(sel?.imageRejectionDb),
  );
  return row;
}

/** The targets a chain states, as checks on a metric row. */
export interface TargetCheck {
  key: string;
  label: string;
  metric: string;
  pass: (v: number) => boolean;
}

/** The checks for the targets given (none when the chain states no targets). */
export function targetChecks(targets: ChainTargets | undefined): TargetCheck[] {
  const t = targets ?? {};
  const checks: TargetCheck[] = [];
  const add = (key: string, label: string, metric: string, pass: (v: number) => boolean) =>
    checks.push({ key, label, metric, pass });
  const lo = t.centreMinHz;
  const hi = t.centreMaxHz;
  if (lo !== undefined || hi !== undefined) {
    add(
      'centre',
      'Centre frequency in its window',
      'peak',
      (v) => (lo === undefined || v >= lo) && (hi === undefined || v <= hi),
    );
  }
  if (t.minBandwidthHz !== undefined)
    add(
      'minBandwidth',
      'Bandwidth at least the minimum',
      'bandwidth',
      (v) => v >= t.minBandwidthHz!,
    );
  if (t.maxBandwidthHz !== undefined)
    add(
      'maxBandwidth',
      'Bandwidth at most the maximum',
      'bandwidth',
      (v) => v <= t.maxBandwidthHz!,
    );
  if (t.minGainDb !== undefined)
    add('minGain', 'Gain at least the minimum', 'gain', (v) => v >= t.minGainDb!);
  if (t.maxNoiseFigureDb !== undefined)
    add('maxNf', 'Noise figure at most the maximum', 'nf', (v) => v <= t.maxNoiseFigureDb!);
  if (t.minImageRejectionDb !== undefined)
    add(
      'minImage',
      'Image rejection at least the minimum',
      'image',
      (v) => v >= t.minImageRejectionDb!,
    );
  return checks;
}
