/**
 * The converter at the end of a digital receiver: the ADC input (R ∥ C) with what the
 * converter does to the signal — its full scale, its noise (ENOB or SNR), its sample rate and
 * the bandwidth the processing after it keeps. The receiver plan reads these to refer the
 * converter's noise to the antenna and to find its clipping headroom.
 */
import type { LoadDefinition, StageDefinition } from '../types';
import { enumParam, numParam, readParams } from './common';
import { ADC_INPUT as ADC_DEFINITION } from './loads';

function loadDefinition(d: StageDefinition): LoadDefinition {
  if (d.role !== 'load') throw new Error(`${d.type} is not a load (programming error)`);
  return d;
}
const ADC_INPUT = loadDefinition(ADC_DEFINITION);

const byVolts = { key: 'fullScaleAs', equals: 'volts' };
const byEnob = { key: 'noiseAs', equals: 'enob' };

const CONVERTER_PARAMS = [
  enumParam('fullScaleAs', 'Full scale given as', [
    ['volts', 'Volts peak-to-peak at the input'],
    ['dbm', 'dBm into the input resistance'],
  ]),
  numParam('fullScaleVpp', 'Full scale', 'volt', 2, {
    min: 0,
    exclusiveMin: true,
    showWhen: byVolts,
    help: 'Peak-to-peak input voltage of a full-scale sine.',
  }),
  numParam('fullScaleDbm', 'Full scale', 'dbm', -3, {
    min: -60,
    max: 40,
    showWhen: { key: 'fullScaleAs', equals: 'dbm' },
    help: 'Power of a full-scale sine delivered into the input resistance.',
  }),
  enumParam('noiseAs', 'Converter noise given as', [
    ['enob', 'Effective number of bits (ENOB)'],
    ['snr', 'SNR of a full-scale sine over the Nyquist band'],
  ]),
  numParam('enob', 'ENOB', 'none', 10, { min: 1, max: 32, showWhen: byEnob }),
  numParam('snrDb', 'SNR (full-scale sine, Nyquist band)', 'db', 62, {
    min: 0,
    max: 200,
    showWhen: { key: 'noiseAs', equals: 'snr' },
  }),
  numParam('sampleRateHz', 'Sample rate', 'hertz', 100e6, { min: 0, exclusiveMin: true }),
  numParam('processingBandwidthHz', 'Processing bandwidth', 'hertz', 0, {
    min: 0,
    help: 'Bandwidth kept by the filtering after the converter; 0 uses the chain’s channel bandwidth.',
  }),
];

/** SNR of an ideal N-bit converter for a full-scale sine over the Nyquist band, dB. */
export function snrOfEnob(enob: number): number {
  return 6.02 * enob + 1.76;
}

/** ADC input with the converter's figures. */
export const ADC_CONVERTER: LoadDefinition = {
  ...ADC_INPUT,
  summary: 'A converter or receiver-chip input: R ∥ C, full scale, ENOB or SNR, sample rate.',
  params: [...ADC_INPUT.params, ...CONVERTER_PARAMS],
  build(values, ctx) {
    const model = ADC_INPUT.build(values, ctx);
    const p = readParams([...ADC_INPUT.params, ...CONVERTER_PARAMS], values);
    const r = p.num('r');
    const fullScaleW =
      p.str('fullScaleAs') === 'volts'
        ? (p.num('fullScaleVpp') / 2) ** 2 / (2 * r)
        : 1e-3 * Math.pow(10, p.num('fullScaleDbm') / 10);
    return {
      ...model,
      converter: {
        fullScaleW,
        snrDb: p.str('noiseAs') === 'enob' ? snrOfEnob(p.num('enob')) : p.num('snrDb'),
        sampleRateHz: p.num('sampleRateHz'),
        processingBandwidthHz: p.num('processingBandwidthHz'),
      },
    };
  },
};
