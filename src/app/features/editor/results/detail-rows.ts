/**
 * Rows for the resonator, selectivity and summary tables, and the ordered flag list.
 * Pure functions of the result and the chain document; the components only lay them out.
 */
import { transmitSummaryItems } from './transmit-summary';
import type { ChainDocument, Thresholds } from '../../../../../shared/schema/chain';
import type { AnalysisResult, Flag, Severity } from '../../../../../shared/engine/types';
import {
  NO_VALUE,
  decibels,
  engineering,
  nominal,
  nominalDecibels,
  nominalEngineering,
  percent,
  plain,
} from './format-quantity';

/** How hard a tank is loaded, judged against the chain's own thresholds. */
export type LoadingState = 'fine' | 'matched' | 'warning' | 'error' | 'unknown';

export interface ResonatorRow {
  key: string;
  stageId: string;
  stage: string;
  resonator: string;
  kind: string;
  node: string;
  /** Declared by its stage, or found in the network (and made of which stages). */
  origin: string;
  /** Where a coupled pair really peaks (blank for a single tuned circuit). */
  pairPeak: string;
  resonance: string;
  loadedQ: string;
  unloadedQ: string;
  bandwidth: string;
  detachedQ: string;
  detachedBandwidth: string;
  loadingRatio: string;
  downstreamShare: string;
  loading: LoadingState;
}

export interface SelectivityRow {
  node: number;
  after: string;
  peak: string;
  peakStepUp: string;
  bw3: string;
  bw60: string;
  shapeFactor: string;
  /** One entry per stated offset, in the order of `offsetHeadings`. */
  offsets: string[];
  image: string;
  imageRejection: string;
}

export interface SummaryItem {
  key: string;
  label: string;
  value: string;
  note?: string;
}

export interface FlagItem {
  key: string;
  flag: Flag;
  stageLabel: string;
  severityText: string;
}

/** Label of a stage as the user sees it on the strip: their label, else its type. */
export function stageLabel(document: ChainDocument, stageId: string): string {
  const stage = document.stages.find((s) => s.id === stageId);
  if (!stage) return stageId;
  return stage.label.trim() || stage.type;
}

/**
 * The engine's loading rule: the ratio as shown (two decimals) below the warning level is a
 * warning, below the error level an error; 0.50 is a conjugate match.
 */
export function loadingState(ratio: number | null, thresholds: Thresholds): LoadingState {
  if (ratio === null || Number.isNaN(ratio)) return 'unknown';
  const shown = Math.round(ratio * 100) / 100;
  if (shown < thresholds.loadingError) return 'error';
  if (shown < thresholds.loadingWarn) return 'warning';
  return shown === 0.5 ? 'matched' : 'fine';
}

function originOf(r: AnalysisResult['resonators'][number], document: ChainDocument): string {
  if (r.origin !== 'found') return 'declared';
  const parts = (r.partOf ?? [r.stageId]).map((id) => stageLabel(document, id));
  return `found: ${parts.join(' + ')}`;
}

export function resonatorRows(result: AnalysisResult, document: ChainDocument): ResonatorRow[] {
  const thresholds = document.settings.thresholds;
  return result.resonators.map((r, i) => ({
    key: `${r.stageId}-${i}`,
    stageId: r.stageId,
    stage: stageLabel(document, r.stageId),
    resonator: r.label,
    kind: r.kind === 'shunt' ? 'Shunt tank' : 'Series',
    node: r.node === null ? 'inside stage' : `Node ${r.node}`,
    origin: originOf(r, document),
    pairPeak: r.pairPeakHz == null ? '' : engineering(r.pairPeakHz, 'hertz'),
    resonance: r.resonanceHz === null ? 'none in sweep' : engineering(r.resonanceHz, 'hertz'),
    loadedQ: plain(r.loadedQ),
    unloadedQ: plain(r.unloadedQ),
    bandwidth: engineering(r.bandwidthHz, 'hertz'),
    detachedQ: plain(r.detachedQ),
    detachedBandwidth: engineering(r.detachedBandwidthHz, 'hertz'),
    loadingRatio: plain(r.loadingRatio),
    downstreamShare: percent(r.downstreamShare),
    loading: loadingState(r.loadingRatio, thresholds),
  }));
}

/** The offsets the user chose, as stated ("±10 kHz", not "±10.00 kHz"). */
export function offsetHeadings(document: ChainDocument): string[] {
  return document.settings.offsetsHz.map((hz) => `±${nominalEngineering(hz, 'hertz')}`);
}

/** The −60 dB width, or why there is none: a floor the response levels off at, or the sweep. */
function bw60Text(s: AnalysisResult['selectivity'][number]): string {
  if (s.bw60dbHz !== null) return engineering(s.bw60dbHz, 'hertz');
  if (s.depthDb != null) return `floor at −${decibels(s.depthDb)}`;
  return 'beyond sweep';
}

export function selectivityRows(result: AnalysisResult): SelectivityRow[] {
  return result.selectivity.map((s) => {
    const node = result.nodes.find((n) => n.index === s.node);
    return {
      node: s.node,
      after: node?.after ?? '',
      peak: engineering(s.peakHz, 'hertz'),
      peakStepUp: decibels(s.peakStepUpDb),
      bw3: engineering(s.bw3dbHz, 'hertz'),
      bw60: bw60Text(s),
      shapeFactor: plain(s.shapeFactor),
      offsets: s.offsets.map((o) =>
        o.belowDb === null && o.aboveDb === null
          ? NO_VALUE
          : `${decibels(o.belowDb)} / ${decibels(o.aboveDb)}`,
      ),
      image: engineering(s.imageHz, 'hertz'),
      imageRejection: decibels(s.imageRejectionDb),
    };
  });
}

/**
 * The chain's figures for the summary tab: a receiver's noise, gain, sensitivity and range,
 * or, in a transmit mode, what the transmitter delivers (see `transmitSummaryItems`).
 */
export function summaryItems(result: AnalysisResult, document: ChainDocument): SummaryItem[] {
  if (result.transmit) return transmitSummaryItems(result.transmit);
  const l = result.levels;
  // The settings are the user's statements: rounded, never padded ("a 3 kHz channel").
  const bandwidth = nominalEngineering(document.settings.channelBandwidthHz, 'hertz');
  const emfRms = l.sensitivityEmfRms;
  return [
    {
      key: 'noise-floor',
      label: 'Noise floor',
      value: decibels(l.noiseFloorDbm, 'dBm'),
      note: `in a ${bandwidth} channel at ${nominal(document.settings.temperatureK)} K`,
    },
    {
      key: 'nf',
      label: 'Noise figure',
      value: decibels(l.noiseFigureDb),
      note: `Te ${plain(l.noiseTemperatureK)} K`,
    },
    {
      key: 'tsys',
      label: 'System noise temperature',
      value: `${plain(l.systemNoiseTemperatureK)} K`,
      note: `at the antenna terminals: source ${nominal(l.sourceNoiseTemperatureK)} K + Te`,
    },
    { key: 'gain', label: 'Total available gain', value: decibels(l.totalGainDb) },
    {
      key: 'sensitivity',
      label: 'Sensitivity',
      value: decibels(l.sensitivityDbm, 'dBm'),
      note: `for ${nominalDecibels(document.settings.requiredSnrDb)} SNR`,
    },
    {
      key: 'sensitivity-emf',
      label: 'Sensitivity as source EMF',
      value: `${engineering(emfRms, 'volt')} rms`,
      note: `${engineering(emfRms * Math.SQRT2, 'volt')} peak`,
    },
    { key: 'iip3', label: 'Input intercept (IIP3)', value: decibels(l.iip3Dbm, 'dBm') },
    { key: 'sfdr', label: 'Spurious-free dynamic range', value: decibels(l.sfdrDb) },
    {
      key: 'input',
      label: 'Input signal',
      value: decibels(l.inputAvailableDbm, 'dBm'),
      note: 'available from the source',
    },
  ];
}

const SEVERITY_ORDER: Record<Severity, number> = { error: 0, warning: 1, info: 2 };
const SEVERITY_TEXT: Record<Severity, string> = {
  error: 'Error',
  warning: 'Warning',
  info: 'Note',
};

/** Flags worst first, then in chain order, so the list reads like a to-do list. */
export function flagItems(result: AnalysisResult, document: ChainDocument): FlagItem[] {
  const position = (id: string) => {
    const i = document.stages.findIndex((s) => s.id === id);
    return i < 0 ? Number.MAX_SAFE_INTEGER : i;
  };
  return result.flags
    .map((flag, i) => ({ flag, i }))
    .sort(
      (a, b) =>
        SEVERITY_ORDER[a.flag.severity] - SEVERITY_ORDER[b.flag.severity] ||
        position(a.flag.stageId) - position(b.flag.stageId) ||
        a.i - b.i,
    )
    .map(({ flag, i }) => ({
      key: `${flag.code}-${flag.stageId}-${i}`,
      flag,
      stageLabel: stageLabel(document, flag.stageId),
      severityText: SEVERITY_TEXT[flag.severity],
    }));
}

export function flagCounts(result: AnalysisResult): Record<Severity, number> {
  const counts: Record<Severity, number> = { error: 0, warning: 0, info: 0 };
  for (const f of result.flags) counts[f.severity] += 1;
  return counts;
}
