import type { AnalysisResult } from '../../../../shared/engine/types';
import type { ChainDocument } from '../../../../shared/schema/chain';
import { significantFigures } from '../../core/format/number-format';
import {
  decibels,
  engineering,
  nominalDecibels,
  nominalEngineering,
} from '../editor/results/format-quantity';
import { transmitRows, verdictWords, type TransmitRows } from '../editor/modes/transmit-rows';

/**
 * What a transmit mode's report adds: the power, the isolation, and the tables of the
 * harmonics and each part (as the editor's transmit panel shows them).
 */
export interface ReportTransmit extends TransmitRows {
  frequency: string;
  delivered: string;
  available: string;
  networkLoss: string;
  /** Power reaching the receiver's input and its isolation, when a part is marked as it. */
  receiver: { power: string; isolation: string; limit: string; verdict: string } | null;
}

/** Said under the transmit figures, as the editor says it. */
export const TRANSMIT_NOTE =
  "Figures at the amplifier's target power, voltages peak and currents rms. Transmitting needs a licence and must meet local rules on power, spurious emissions and RF exposure; defer to licensed practice.";

/** The transmit figures of a report, or null when the result is not a transmit mode's. */
export function reportTransmit(
  result: AnalysisResult | null,
  doc: ChainDocument,
): ReportTransmit | null {
  const tx = result?.transmit;
  if (!tx) return null;
  const labels = new Map(doc.stages.map((s) => [s.id, s.label.trim() || s.type]));
  const rx = tx.receiverInput;
  return {
    // The design frequency is stated: rounded, not padded, to at least 5 figures, as the
    // editor's transmit panel writes it (433.92 MHz).
    frequency: nominalEngineering(tx.f0Hz, 'hertz', Math.max(5, significantFigures())),
    delivered: `${engineering(tx.deliveredW, 'watt')} (${decibels(tx.deliveredDbm, 'dBm')})`,
    available: engineering(tx.availableW, 'watt'),
    networkLoss: decibels(tx.networkLossDb, 'dB', 2),
    receiver: rx
      ? {
          power: decibels(rx.dbm, 'dBm'),
          isolation: decibels(rx.isolationDb),
          limit: rx.limitDbm === null ? '—' : nominalDecibels(rx.limitDbm, 'dBm'),
          verdict: verdictWords(rx.ok),
        }
      : null,
    ...transmitRows(tx, labels),
  };
}
