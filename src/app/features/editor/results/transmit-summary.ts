import type { AnalysisResult } from '../../../../../shared/engine/types';
import type { SummaryItem } from './detail-rows';
import { decibels, engineering, nominalDecibels } from './format-quantity';

type Transmit = NonNullable<AnalysisResult['transmit']>;

/**
 * A judged figure's words: within the stated limit, over it, or no limit stated. The limit
 * is the user's, written as stated (`nominalDecibels`: "20 dB", not "20.00 dB").
 */
export function limitWords(ok: boolean | null, limit: string | null): string {
  if (ok === null || limit === null) return 'no limit stated';
  return ok ? `within the ${limit} limit` : `over the ${limit} limit`;
}

/**
 * The headline figures of a transmit mode: the power into the antenna, the loss on the way,
 * the 2nd and 3rd harmonics' attenuation against their limits, the receiver's isolation and
 * how many parts run over their ratings. A receiver's noise figure means nothing here.
 */
export function transmitSummaryItems(tx: Transmit): SummaryItem[] {
  const items: SummaryItem[] = [
    {
      key: 'tx-delivered',
      label: 'Into the antenna',
      value: engineering(tx.deliveredW, 'watt'),
      note: `${decibels(tx.deliveredDbm, 'dBm')} of ${engineering(tx.availableW, 'watt')} offered by the amplifier`,
    },
    { key: 'tx-loss', label: 'Network loss', value: decibels(tx.networkLossDb, 'dB', 2) },
  ];
  for (const h of tx.harmonics) {
    items.push({
      key: `tx-harmonic-${h.n}`,
      label: `Harmonic ${h.n}·f0 attenuation`,
      value: decibels(h.attenuationDb),
      note: `at ${engineering(h.fHz, 'hertz')}, ${limitWords(h.ok, h.limitDb === null ? null : nominalDecibels(h.limitDb))}`,
    });
  }
  const rx = tx.receiverInput;
  if (rx) {
    items.push({
      key: 'tx-isolation',
      label: 'Receiver isolation',
      value: decibels(rx.isolationDb),
      note: `${decibels(rx.dbm, 'dBm')} reaches the receiver input, ${limitWords(rx.ok, rx.limitDbm === null ? null : nominalDecibels(rx.limitDbm, 'dBm'))}`,
    });
  }
  const judged = tx.parts.filter((p) => p.ok !== null);
  const over = judged.filter((p) => p.ok === false).length;
  items.push({
    key: 'tx-parts',
    label: 'Parts over their rating',
    value: judged.length ? `${over} of ${judged.length}` : 'none rated',
    note: `highest voltage ${engineering(Math.max(0, ...tx.parts.map((p) => p.vPeak)), 'volt')} peak`,
  });
  return items;
}

/** The keys of the figures above the result tabs in a transmit mode. */
export const TRANSMIT_HEADLINE = ['tx-delivered', 'tx-harmonic-2', 'tx-isolation', 'tx-parts'];
