import type { AnalysisResult } from '../../../../../shared/engine/types';
import {
  decibels,
  engineering,
  nominalDecibels,
  nominalEngineering,
} from '../results/format-quantity';

type Transmit = NonNullable<AnalysisResult['transmit']>;

/** A judged figure's verdict: within its stated limit (true), over it (false), or no limit (null). */
export type Verdict = boolean | null;

export interface TransmitHarmonicRow {
  n: number;
  frequency: string;
  attenuation: string;
  limit: string;
  ok: Verdict;
}

export interface TransmitPartRow {
  key: string;
  stageId: string;
  name: string;
  voltage: string;
  current: string;
  power: string;
  rating: string;
  ok: Verdict;
}

/** The tables of a transmit mode's analysis, written for the screen and the report alike. */
export interface TransmitRows {
  harmonics: TransmitHarmonicRow[];
  parts: TransmitPartRow[];
}

/** The verdict in words. */
export function verdictWords(ok: Verdict): string {
  return ok === null ? 'no limit stated' : ok ? 'within limit' : 'over limit';
}

/** The classes of a verdict's mark (styles.scss): ok, bad, or none stated. */
export function verdictClass(ok: Verdict): string {
  return `cw-verdict ${ok === null ? 'none' : ok ? 'ok' : 'bad'}`;
}

/** The part's name with its stage's, unless its label already starts with it. */
function partName(stage: string | undefined, label: string): string {
  return stage && !label.startsWith(stage) ? `${stage} · ${label}` : label;
}

/** A part's rating as stated (rounded, not padded): peak volts and rms amps, whichever it has. */
function rating(p: Transmit['parts'][number]): string {
  const stated = [
    p.ratedPeakVolts === null ? '' : `${nominalEngineering(p.ratedPeakVolts, 'volt')} peak`,
    p.ratedRmsAmps === null ? '' : `${nominalEngineering(p.ratedRmsAmps, 'ampere')} rms`,
  ];
  return stated.filter(Boolean).join(', ') || '—';
}

/**
 * Each harmonic against its limit and each part's stress at the transmit power.
 * @param labels stage labels by id, to name the stage of a part whose own label does not
 */
export function transmitRows(tx: Transmit, labels: ReadonlyMap<string, string>): TransmitRows {
  return {
    harmonics: tx.harmonics.map((h) => ({
      n: h.n,
      frequency: engineering(h.fHz, 'hertz', 5),
      attenuation: decibels(h.attenuationDb),
      // The limit is the user's: written as stated, not padded to the figures.
      limit: h.limitDb === null ? '—' : nominalDecibels(h.limitDb),
      ok: h.ok,
    })),
    parts: tx.parts.map((p, i) => ({
      key: `${p.stageId}-${i}`,
      stageId: p.stageId,
      name: partName(labels.get(p.stageId), p.label),
      voltage: engineering(p.vPeak, 'volt'),
      current: engineering(p.iRms, 'ampere'),
      power: engineering(p.powerW, 'watt'),
      rating: rating(p),
      ok: p.ok,
    })),
  };
}
