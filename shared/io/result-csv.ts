/**
 * The analysis tables as CSV tables (for the shared writer): resonators, cumulative
 * selectivity, flags and the noise and level figures. Values are SI numbers in the unit
 * the heading names, not the rounded text on screen, so a spreadsheet can recompute.
 */
import type { AnalysisResult } from '../engine/result-types';
import type { ChainDocument } from '../schema/chain';
import type { CsvTable } from './csv-writer';

/** The user's label of a stage, else its type; the id when the stage is gone. */
function labelOf(doc: ChainDocument, stageId: string): string {
  const stage = doc.stages.find((s) => s.id === stageId);
  return stage ? stage.label.trim() || stage.type : stageId;
}

export function resonatorsCsv(result: AnalysisResult, doc: ChainDocument): CsvTable {
  return {
    columns: [
      'Stage',
      'Resonator',
      'Kind',
      'Node',
      'Origin',
      'Resonance (Hz)',
      'Pair peak (Hz)',
      'Loaded Q',
      'Unloaded Q',
      'Bandwidth (Hz)',
      'Q detached',
      'Bandwidth detached (Hz)',
      'Loading ratio',
      'Downstream share',
    ],
    rows: result.resonators.map((r) => [
      labelOf(doc, r.stageId),
      r.label,
      r.kind,
      r.node,
      r.origin === 'found'
        ? `found: ${(r.partOf ?? [r.stageId]).map((id) => labelOf(doc, id)).join(' + ')}`
        : 'declared',
      r.resonanceHz,
      r.pairPeakHz,
      r.loadedQ,
      r.unloadedQ,
      r.bandwidthHz,
      r.detachedQ,
      r.detachedBandwidthHz,
      r.loadingRatio,
      r.downstreamShare,
    ]),
  };
}

export function selectivityCsv(result: AnalysisResult): CsvTable {
  const offsets = result.selectivity[0]?.offsets.map((o) => o.offsetHz) ?? [];
  return {
    columns: [
      'Node',
      'After',
      'Peak (Hz)',
      'Peak step-up (dB)',
      'Bandwidth -3 dB (Hz)',
      'Bandwidth -60 dB (Hz)',
      'Depth in sweep (dB)',
      'Shape factor',
      ...offsets.flatMap((hz) => [`Below at ${hz} Hz (dB)`, `Above at ${hz} Hz (dB)`]),
      'Image (Hz)',
      'Image rejection (dB)',
    ],
    rows: result.selectivity.map((s) => [
      s.node,
      result.nodes.find((n) => n.index === s.node)?.after ?? '',
      s.peakHz,
      s.peakStepUpDb,
      s.bw3dbHz,
      s.bw60dbHz,
      s.depthDb,
      s.shapeFactor,
      ...s.offsets.flatMap((o) => [o.belowDb, o.aboveDb]),
      s.imageHz,
      s.imageRejectionDb,
    ]),
  };
}

const SEVERITY_RANK = { error: 0, warning: 1, info: 2 } as const;

/** Worst first, then in chain order, as the flags list reads. */
export function flagsCsv(result: AnalysisResult, doc: ChainDocument): CsvTable {
  const position = (id: string) => {
    const i = doc.stages.findIndex((s) => s.id === id);
    return i < 0 ? Number.MAX_SAFE_INTEGER : i;
  };
  const flags = result.flags
    .map((flag, i) => ({ flag, i }))
    .sort(
      (a, b) =>
        SEVERITY_RANK[a.flag.severity] - SEVERITY_RANK[b.flag.severity] ||
        position(a.flag.stageId) - position(b.flag.stageId) ||
        a.i - b.i,
    );
  return {
    columns: ['Severity', 'Stage', 'Code', 'Message'],
    rows: flags.map(({ flag }) => [
      flag.severity,
      labelOf(doc, flag.stageId),
      flag.code,
      flag.message,
    ]),
  };
}

/** The noise and level figures of the whole chain: figure, value, unit. */
export function levelsCsv(result: AnalysisResult, doc: ChainDocument): CsvTable {
  const l = result.levels;
  const s = doc.settings;
  return {
    columns: ['Figure', 'Value', 'Unit'],
    rows: [
      ['Design frequency', result.f0Hz, 'Hz'],
      ['Channel bandwidth', s.channelBandwidthHz, 'Hz'],
      ['Noise floor', l.noiseFloorDbm, 'dBm'],
      ['Noise figure', l.noiseFigureDb, 'dB'],
      ['Noise figure (correlation-matrix check)', l.correlationNoiseFigureDb, 'dB'],
      ['Effective input noise temperature', l.noiseTemperatureK, 'K'],
      ['Source noise temperature', l.sourceNoiseTemperatureK, 'K'],
      ['System noise temperature', l.systemNoiseTemperatureK, 'K'],
      ['Total available gain', l.totalGainDb, 'dB'],
      ['Required SNR', s.requiredSnrDb, 'dB'],
      ['Sensitivity', l.sensitivityDbm, 'dBm'],
      ['Sensitivity as source EMF', l.sensitivityEmfRms, 'V rms'],
      ['Input intercept (IIP3)', l.iip3Dbm, 'dBm'],
      ['Spurious-free dynamic range', l.sfdrDb, 'dB'],
      ['Input signal available', l.inputAvailableDbm, 'dBm'],
    ],
  };
}
