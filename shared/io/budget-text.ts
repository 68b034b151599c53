/**
 * The analysis of a chain as aligned plain text (the CLI's budget table): one column per
 * node with impedances, step-up, gains, noise figure, intercept and level; then the
 * resonators with loaded Q, bandwidth and loading ratio; selectivity; levels; flags.
 */
import { formatNumber, formatQuantity } from '../engine/core/format';
import type { AnalysisResult, ComplexJson, SweepReport } from '../engine/types';

/** Pads cells into columns: the first left-aligned, the others right-aligned. */
export function alignColumns(rows: string[][], gap = 2): string {
  const widths: number[] = [];
  for (const row of rows) {
    row.forEach((cell, c) => (widths[c] = Math.max(widths[c] ?? 0, [...cell].length)));
  }
  return rows
    .map((row) =>
      row
        .map((cell, c) => {
          const pad = ' '.repeat(widths[c] - [...cell].length);
          return c === 0 ? cell + pad : pad + cell;
        })
        .join(' '.repeat(gap))
        .trimEnd(),
    )
    .join('\n');
}

const DASH = '—';
const dec = (v: number | null | undefined, places = 2) =>
  v === null || v === undefined || !Number.isFinite(v) ? DASH : v.toFixed(places);
const qty = (v: number | null | undefined, unit: Parameters<typeof formatQuantity>[1]) =>
  v === null || v === undefined ? DASH : formatQuantity(v, unit, 4);

function impedance(z: ComplexJson): string {
  if (!Number.isFinite(z.re) || !Number.isFinite(z.im)) return 'open';
  const sign = z.im < 0 ? '−' : '+';
  return `${formatNumber(z.re, 4)}${sign}j${formatNumber(Math.abs(z.im), 4)}`;
}

/** The budget table: one column per node (node k follows stage k). */
export function nodeTable(result: AnalysisResult): string {
  const nodes = result.nodes;
  const byToNode = new Map(result.stages.map((s) => [s.toNode, s]));
  const stageCell = (k: number, pick: (s: AnalysisResult['stages'][number]) => string) => {
    const s = byToNode.get(k);
    return s ? pick(s) : DASH;
  };
  const rows: string[][] = [
    ['Node', ...nodes.map((n) => `n${n.index}`)],
    ['After', ...nodes.map((n) => n.after)],
    ['Zin toward load (Ω)', ...nodes.map((n) => impedance(n.zIn))],
    ['Zsrc toward source (Ω)', ...nodes.map((n) => impedance(n.zSrc))],
    ['Step-up |V|/|Es| (dB)', ...nodes.map((n) => dec(n.stepUpDb))],
    ['Voltage (rms)', ...nodes.map((n) => qty(n.vRms, 'volt'))],
    [
      'Stage voltage gain (dB)',
      ...nodes.map((n) => stageCell(n.index, (s) => dec(s.voltageGainDb))),
    ],
    ['Available gain (dB)', ...nodes.map((n) => stageCell(n.index, (s) => dec(s.availableGainDb)))],
    ['Transducer gain (dB)', ...nodes.map((n) => dec(n.transducerGainDb))],
    [
      'Cumulative NF (dB)',
      ...nodes.map((n) => stageCell(n.index, (s) => dec(s.cumulativeNoiseFigureDb))),
    ],
    [
      'Cumulative Te (K)',
      ...nodes.map((n) => stageCell(n.index, (s) => dec(s.cumulativeNoiseTemperatureK, 1))),
    ],
    [
      'Cumulative IIP3 (dBm)',
      ...nodes.map((n) => stageCell(n.index, (s) => dec(s.cumulativeIip3Dbm))),
    ],
    ['Delivered (dBm)', ...nodes.map((n) => dec(n.deliveredDbm))],
    ['Available (dBm)', ...nodes.map((n) => dec(n.availableDbm))],
    ['Mismatch loss (dB)', ...nodes.map((n) => dec(n.mismatchLossDb))],
    // Against the reference chosen for each node; a dash where none was chosen.
    ['Return loss vs ref (dB)', ...nodes.map((n) => dec(n.returnLossDb))],
  ];
  return alignColumns(rows);
}

/** Resonators: resonance, loaded and unloaded Q, bandwidth, and what the next stage does. */
export function resonatorTable(result: AnalysisResult): string {
  if (result.resonators.length === 0) return 'No resonators.';
  const rows = [
    [
      'Resonator',
      'Node',
      'fr',
      'Loaded Q',
      'Unloaded Q',
      'BW',
      'Q detached',
      'BW detached',
      'Loading ratio',
      'Downstream share',
    ],
    ...result.resonators.map((r) => [
      `${r.label} (${r.stageId}, ${r.kind})`,
      r.node === null ? DASH : `n${r.node}`,
      qty(r.resonanceHz, 'hertz'),
      dec(r.loadedQ, 1),
      dec(r.unloadedQ, 1),
      qty(r.bandwidthHz, 'hertz'),
      dec(r.detachedQ, 1),
      qty(r.detachedBandwidthHz, 'hertz'),
      dec(r.loadingRatio, 3),
      r.downstreamShare === null ? DASH : `${(100 * r.downstreamShare).toFixed(1)} %`,
    ]),
  ];
  return alignColumns(rows);
}

function selectivityTable(result: AnalysisResult): string {
  const rows = [
    [
      'Selectivity at',
      'Peak',
      'Peak step-up (dB)',
      '−3 dB BW',
      '−60 dB BW',
      'Shape factor',
      'Image rejection (dB)',
    ],
    ...result.selectivity.map((s) => [
      `n${s.node}`,
      qty(s.peakHz, 'hertz'),
      dec(s.peakStepUpDb),
      qty(s.bw3dbHz, 'hertz'),
      qty(s.bw60dbHz, 'hertz'),
      dec(s.shapeFactor, 2),
      dec(s.imageRejectionDb, 1),
    ]),
  ];
  return alignColumns(rows);
}

function levelsTable(result: AnalysisResult): string {
  const l = result.levels;
  return alignColumns([
    ['Input available power', `${dec(l.inputAvailableDbm)} dBm`],
    ['Total gain', `${dec(l.totalGainDb)} dB`],
    ['Noise figure', `${dec(l.noiseFigureDb)} dB (Te ${dec(l.noiseTemperatureK, 1)} K)`],
    ['System noise temperature', `${dec(l.systemNoiseTemperatureK, 1)} K at the antenna`],
    ['Noise floor', `${dec(l.noiseFloorDbm)} dBm`],
    ['Sensitivity', `${dec(l.sensitivityDbm)} dBm (${qty(l.sensitivityEmfRms, 'volt')} rms EMF)`],
    ['Cascaded IIP3', l.iip3Dbm === null ? DASH : `${dec(l.iip3Dbm)} dBm`],
    ['Spurious-free dynamic range', l.sfdrDb === null ? DASH : `${dec(l.sfdrDb, 1)} dB`],
  ]);
}

function flagLines(result: AnalysisResult): string {
  if (result.flags.length === 0) return 'No flags.';
  return result.flags
    .map((f) => `${f.severity.toUpperCase()} [${f.code}] ${f.stageId}: ${f.message}`)
    .join('\n');
}

/** The sweep as a table: frequency, step-up at every node, and Zin. */
export function sweepTable(sweep: SweepReport): string {
  const rows = [
    ['f (Hz)', ...sweep.nodes.map((n) => `n${n.index} (dB)`), 'Zin re (Ω)', 'Zin im (Ω)'],
    ...sweep.freqsHz.map((f, i) => [
      formatNumber(f, 9),
      ...sweep.nodes.map((n) => dec(n.stepUpDb[i], 3)),
      formatNumber(sweep.zIn.re[i], 6),
      formatNumber(sweep.zIn.im[i], 6),
    ]),
  ];
  return alignColumns(rows);
}

/** The whole report as text. Voltages are PEAK phasors inside the engine; rms is shown. */
export function budgetText(name: string, result: AnalysisResult): string {
  return [
    `Chain "${name}" at f0 = ${formatQuantity(result.f0Hz, 'hertz', 6)} (engine ${result.engineVersion}; voltages rms)`,
    '',
    nodeTable(result),
    '',
    resonatorTable(result),
    '',
    selectivityTable(result),
    '',
    levelsTable(result),
    '',
    'Flags',
    flagLines(result),
    ...(result.sweep ? ['', 'Sweep', sweepTable(result.sweep)] : []),
  ].join('\n');
}
