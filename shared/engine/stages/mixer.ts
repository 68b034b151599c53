/**
 * Mixer: a unilateral stage that translates frequency. Everything after it is evaluated
 * at the output frequency, so a sweep over RF shows the image through the preselector.
 */
import { StageParameterError } from '../errors';
import type { StageDefinition } from '../types';
import { enumParam, numParam, readParams } from './common';
import { gmForStatedGain, unilateralSection } from './active-common';

const fromIf = { key: 'loSource', equals: 'from-if' };

const PARAMS = [
  numParam('conversionGainDb', 'Conversion gain', 'db', 10, {
    min: -40,
    max: 40,
    help: 'Available conversion gain from a source equal to the input resistance (negative for a diode mixer).',
  }),
  numParam('nfDb', 'Noise figure (single sideband)', 'db', 10, { min: 0, max: 40 }),
  numParam('iip3Dbm', 'Input third-order intercept (IIP3)', 'dbm', 5, { min: -60, max: 80 }),
  numParam('p1dbDbm', 'Input 1 dB compression point', 'dbm', -5, { min: -80, max: 80 }),
  numParam('rin', 'Input resistance', 'ohm', 1500, { min: 0, exclusiveMin: true }),
  numParam('rout', 'Output resistance', 'ohm', 1500, { min: 0, exclusiveMin: true }),
  enumParam('conversion', 'Conversion', [
    ['down', 'Down: output at |f − fLO|'],
    ['up', 'Up: output at f + fLO'],
  ]),
  enumParam('loSource', 'LO set by', [
    ['from-if', 'Output frequency and LO side'],
    ['frequency', 'LO frequency'],
  ]),
  numParam('ifHz', 'Output (IF) frequency at the design frequency', 'hertz', 455e3, {
    min: 0,
    exclusiveMin: true,
    showWhen: fromIf,
  }),
  enumParam(
    'side',
    'LO side',
    [
      ['high', 'High side (LO above the signal)'],
      ['low', 'Low side (LO below the signal)'],
    ],
    { showWhen: fromIf },
  ),
  numParam('loHz', 'LO frequency', 'hertz', 10.455e6, {
    min: 0,
    exclusiveMin: true,
    showWhen: { key: 'loSource', equals: 'frequency' },
  }),
];

/** The LO frequency a mixer stage uses, for signal frequency f0 at its input. */
export function mixerLoFrequency(
  f0: number,
  mode: { loSource: string; conversion: string; side: string; ifHz: number; loHz: number },
): number {
  if (mode.loSource === 'frequency') return mode.loHz;
  if (mode.conversion === 'up') {
    if (!(mode.ifHz > f0)) {
      throw new StageParameterError(
        'ifHz',
        `an up-converter's output (${mode.ifHz} Hz) must be above its input (${f0} Hz)`,
      );
    }
    return mode.ifHz - f0;
  }
  const lo = mode.side === 'high' ? f0 + mode.ifHz : f0 - mode.ifHz;
  if (!(lo > 0)) {
    throw new StageParameterError(
      'side',
      `a low-side LO would be at ${lo} Hz: use a high-side LO or a lower IF`,
    );
  }
  return lo;
}

/** Frequency translation: |f − fLO| (down) or f + fLO (up). */
export function mixerTranslate(conversion: string, lo: number): (f: number) => number {
  return conversion === 'up' ? (f) => f + lo : (f) => Math.abs(f - lo);
}

/** Mixer stage. */
export const MIXER: StageDefinition = {
  type: 'mixer',
  category: 'mixer',
  role: 'two-port',
  label: 'Mixer',
  summary: 'Moves the signal to the IF with the local oscillator; the image comes along too.',
  params: PARAMS,
  // Typical figures of the trade (common practice, from memory; not a given part).
  presets: [
    {
      key: 'diode-ring',
      label: 'Diode ring, passive (typical)',
      values: { conversionGainDb: -6, nfDb: 6.5, iip3Dbm: 15, p1dbDbm: 1, rin: 50, rout: 50 },
    },
    {
      key: 'gilbert-cell',
      label: 'Gilbert-cell, active (typical)',
      values: { conversionGainDb: 14, nfDb: 5, iip3Dbm: -13, p1dbDbm: -20, rin: 1500, rout: 1500 },
    },
  ],
  build(values, ctx) {
    const p = readParams(PARAMS, values);
    const lo = mixerLoFrequency(ctx.f0Hz, {
      loSource: p.str('loSource'),
      conversion: p.str('conversion'),
      side: p.str('side'),
      ifHz: p.num('ifHz'),
      loHz: p.num('loHz'),
    });
    const rin = p.num('rin');
    const rout = p.num('rout');
    const gm = gmForStatedGain(p.num('conversionGainDb'), rin, rout);
    const translate = mixerTranslate(p.str('conversion'), lo);
    return {
      sections: [unilateralSection({ rin, cin: 0, rout, cout: 0, gm }, translate)],
      // A stated figure holds when the mixer is driven from its own input resistance.
      noise: { kind: 'figure', nfDb: p.num('nfDb'), ratedSourceOhm: rin },
      linearity: { iip3Dbm: p.num('iip3Dbm'), p1dbDbm: p.num('p1dbDbm') },
      // No spice: a frequency-translating stage has no single-frequency AC equivalent.
    };
  },
};
