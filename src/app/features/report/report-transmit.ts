import type { AnalysisResult } from '../../../../shared/engine/types';
import type { ChainDocument } from '../../../../shared/schema/chain';
import { significantFigures } from '../../core/format/number-format';
import {
  decibels,
  engineering,
  nominalDecibels,
  nominalEngineering,
} from '../editor/results/format-quantity';

type Transmit = NonNullable<AnalysisResult['transmit']>;

export interface ReportHarmonicRow {
  n: number;
  frequency: string;
  attenuation: string;
  limit: string;
  verdict: string;
}

export interface ReportPartRow {
  key: string;
  name: string;
  voltage: string;
  current: string;
  power: string;
  rating: string;
  verdict: string;
}

/** What a transmit mode's report adds: the power, the harmonics, the isolation, each part. */
export interface ReportTransmit {
  frequency: string;
  delivered: string;
  available: string;
  networkLoss: string;
  harmonics: ReportHarmonicRow[];
  /** Power reaching the receiver's input and its isolation, when a part is marked as it. */
  receiver: { power: string; isolation: string; limit: string; verdict: string } | null;
  parts: ReportPartRow[];
}

/** Said under the transmit figures, as the editor says it. */
export const TRANSMIT_NOTE =
  "Figures at the amplifier's target power, voltages peak and currents rms. Transmitting needs a licence and must meet local rules on power, spurious emissions and RF exposure; defer to licensed practice.";

function verdict(ok: boolean | null): string {
  return ok === null ? 'no limit stated' : ok ? 'within limit' : 'over limit';
}

/** The part's name with its stage's, unless its label already starts with it. */
function partName(stage: string | undefined, label: string): string {
  return stage && !label.startsWith(stage) ? `${stage} · ${label}` : label;
}

/** The transmit figures of a report, or null when the result is not a transmit mode's. */
export function reportTransmit(
  result: AnalysisResult | null,
  doc: ChainDocument,
): ReportTransmit | null {
  const tx: Transmit | undefined = result?.transmit;
  if (!tx) return null;
  const labels = new Map(doc.stages.map((s) => [s.id, s.label.trim() || s.type]));
  const rx = tx.receiverInput;
  return {
    // The design frequency and the limits and ratings are stated: rounded, not padded; the
    // frequency to at least 5 figures, as the editor's transmit panel writes it (433.92 MHz).
    frequency: nominalEngineering(tx.f0Hz, 'hertz', Math.max(5, significantFigures())),
    delivered: `${engineering(tx.deliveredW, 'watt')} (${decibels(tx.deliveredDbm, 'dBm')})`,
    available: engineering(tx.availableW, 'watt'),
    networkLoss: decibels(tx.networkLossDb, 'dB', 2),
    harmonics: tx.harmonics.map((h) => ({
      n: h.n,
      frequency: engineering(h.fHz, 'hertz'),
      attenuation: decibels(h.attenuationDb),
      limit: h.limitDb === null ? '—' : nominalDecibels(h.limitDb),
      verdict: verdict(h.ok),
    })),
    receiver: rx
      ? {
          power: decibels(rx.dbm, 'dBm'),
          isolation: decibels(rx.isolationDb),
          limit: rx.limitDbm === null ? '—' : nominalDecibels(rx.limitDbm, 'dBm'),
          verdict: verdict(rx.ok),
        }
      : null,
    parts: tx.parts.map((p, i) => ({
      key: `${p.stageId}-${i}`,
      name: partName(labels.get(p.stageId), p.label),
      voltage: engineering(p.vPeak, 'volt'),
      current: engineering(p.iRms, 'ampere'),
      power: engineering(p.powerW, 'watt'),
      rating:
        [
          p.ratedPeakVolts === null ? '' : `${nominalEngineering(p.ratedPeakVolts, 'volt')} peak`,
          p.ratedRmsAmps === null ? '' : `${nominalEngineering(p.ratedRmsAmps, 'ampere')} rms`,
        ]
          .filter(Boolean)
          .join(', ') || '—',
      verdict: verdict(p.ok),
    })),
  };
}
