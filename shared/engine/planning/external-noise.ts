/**
 * Noise from outside the receiver: the median man-made noise and galactic noise of
 * Recommendation ITU-R P.372 ("Radio noise"), and an atmospheric figure the user enters,
 * as external noise figures Fa (dB above kT0·b) and an antenna noise temperature.
 *
 * P.372 gives the median external noise figure of each source as a straight line in
 * log-frequency, Fam = c − d·log10(f_MHz), with the constants of its table of man-made
 * noise environments (Rec. ITU-R P.372, section 5, Table 2; valid 0.3–250 MHz) and of
 * galactic noise (same table; 52 − 23·log10 f, heard on the ground only above the
 * ionosphere's critical frequency, some 10 MHz at most, up to about 1 GHz).
 * Fa relates to the antenna noise temperature by Fa = 10·log10(Ta/T0) (P.372, eq. 3).
 */
import { T0_KELVIN } from '../core/noise';

export type NoiseEnvironment = 'business' | 'residential' | 'rural' | 'quiet-rural' | 'none';

/** P.372 Table 2 constants: Fam = c − d·log10(f_MHz). */
export const P372_MAN_MADE: Readonly<Record<Exclude<NoiseEnvironment, 'none'>, { c: number; d: number }>> = {
  business: { c: 76.8, d: 27.7 },
  residential: { c: 72.5, d: 27.7 },
  rural: { c: 67.2, d: 27.7 },
  'quiet-rural': { c: 53.6, d: 28.6 },
}; // prettier-ignore
/** P.372 Table 2, galactic noise. */
export const P372_GALACTIC = { c: 52.0, d: 23.0 } as const;
/** Frequency range of the man-made lines, MHz (P.372). */
export const P372_MAN_MADE_RANGE_MHZ = [0.3, 250] as const;
/** Where galactic noise is counted, MHz (common practice: above the ionosphere's cut-off). */
export const GALACTIC_RANGE_MHZ = [10, 1000] as const;

const { log10, pow } = Math;

/** Median man-made external noise figure Fam, dB above kT0·b, at f (Hz). */
export function manMadeNoiseFigureDb(env: Exclude<NoiseEnvironment, 'none'>, fHz: number): number {
  const { c, d } = P372_MAN_MADE[env];
  return c - d * log10(fHz / 1e6);
}

/** Median galactic external noise figure, dB above kT0·b, at f (Hz). */
export function galacticNoiseFigureDb(fHz: number): number {
  return P372_GALACTIC.c - P372_GALACTIC.d * log10(fHz / 1e6);
}

/** Noise temperature (K) of an external noise figure Fa (dB): Ta = T0·10^(Fa/10). */
export function noiseTemperatureOfFa(faDb: number): number {
  return T0_KELVIN * pow(10, faDb / 10);
}

/** Noise figure (dB) of a noise temperature: 10·log10(1 + Te/T0). */
export function noiseFigureOfTemperature(teK: number): number {
  return 10 * log10(1 + teK / T0_KELVIN);
}

export interface ExternalNoiseInput {
  environment: NoiseEnvironment;
  /** Count galactic noise (only inside its range). */
  galactic: boolean;
  /** Atmospheric noise figure the user read off P.372's maps for the time and place, dB; null: none. */
  atmosphericFaDb: number | null;
}

export interface ExternalNoiseFigures {
  manMadeFaDb: number | null;
  galacticFaDb: number | null;
  atmosphericFaDb: number | null;
  /** The sources added as powers (they are independent), dB above kT0·b; null: none counted. */
  totalFaDb: number | null;
  antennaTempK: number;
  /** Sources whose P.372 line was used outside its stated range. */
  outsideRange: string[];
}

/** External noise at f (Hz): each source's Fa and their power sum as an antenna temperature. */
export function externalNoise(fHz: number, input: ExternalNoiseInput): ExternalNoiseFigures {
  const fMHz = fHz / 1e6;
  const outsideRange: string[] = [];
  let manMadeFaDb: number | null = null;
  if (input.environment !== 'none') {
    manMadeFaDb = manMadeNoiseFigureDb(input.environment, fHz);
    const [lo, hi] = P372_MAN_MADE_RANGE_MHZ;
    if (fMHz < lo || fMHz > hi) outsideRange.push(`man-made (${lo}–${hi} MHz)`);
  }
  const [glo, ghi] = GALACTIC_RANGE_MHZ;
  const galacticFaDb =
    input.galactic && fMHz >= glo && fMHz <= ghi ? galacticNoiseFigureDb(fHz) : null;
  const atmosphericFaDb = input.atmosphericFaDb;
  let tempK = 0;
  for (const fa of [manMadeFaDb, galacticFaDb, atmosphericFaDb]) {
    if (fa !== null) tempK += noiseTemperatureOfFa(fa);
  }
  return {
    manMadeFaDb,
    galacticFaDb,
    atmosphericFaDb,
    totalFaDb: tempK > 0 ? 10 * log10(tempK / T0_KELVIN) : null,
    antennaTempK: tempK,
    outsideRange,
  };
}
