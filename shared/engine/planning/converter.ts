/**
 * The converter at the end of the chain: its noise referred to the antenna, the clipping
 * headroom for the strongest stated signal, and the gain-control range the two leave.
 *
 * An ideal converter's full-scale sine has SNR = 6.02·ENOB + 1.76 dB over the Nyquist band
 * fs/2 (the standard quantisation-noise result); filtering to a processing bandwidth B gives
 * back 10·log10(fs/(2·B)) dB (processing gain, with the noise spread evenly over fs/2).
 */
import { BOLTZMANN } from '../core/noise';

const { log10, pow } = Math;
const dbm = (w: number) => 10 * log10(w / 1e-3);
const fromDbm = (d: number) => 1e-3 * pow(10, d / 10);

export interface ConverterInput {
  fullScaleW: number;
  snrDb: number;
  sampleRateHz: number;
  processingBandwidthHz: number;
  /** Transducer gain from the antenna to the converter's input at f0, dB. */
  gainDb: number;
  /** The front end's noise figure (antenna to converter), dB. */
  frontEndNfDb: number;
  temperatureK: number;
  /** The strongest signal expected at the antenna, dBm available. */
  strongestDbm: number;
  /** SNR the demodulator needs, dB (for the weakest usable signal). */
  requiredSnrDb: number;
}

export interface ConverterReport {
  fullScaleDbm: number;
  snrDb: number;
  processingBandwidthHz: number;
  processingGainDb: number;
  /** The converter's own noise in the processing bandwidth, at its input, dBm. */
  noiseAtInputDbm: number;
  /** ...and referred to the antenna through the chain's gain, dBm. */
  noiseAtAntennaDbm: number;
  /** The front end's own noise in the same bandwidth at the antenna, kT·B·F, dBm. */
  frontEndNoiseAtAntennaDbm: number;
  /** True when the converter, not the front end, sets the noise floor. */
  converterSetsFloor: boolean;
  /** Noise figure of front end and converter together, dB. */
  systemNfDb: number;
  /** Full scale minus the strongest signal at the converter, dB (negative: it clips). */
  headroomDb: number;
  clips: boolean;
  /** Full scale above the total noise at the converter, in the processing bandwidth, dB. */
  dynamicRangeDb: number;
  /** From the weakest usable signal (noise floor + required SNR) to the strongest, dB. */
  signalRangeDb: number;
  /** Gain control the chain needs on top of the converter's range, dB (0: none). */
  agcRangeDb: number;
}

/** Converter figures for a chain whose last stage is a converter. */
export function converterReport(c: ConverterInput): ConverterReport {
  const fullScaleDbm = dbm(c.fullScaleW);
  const processingGainDb = 10 * log10(c.sampleRateHz / (2 * c.processingBandwidthHz));
  const noiseAtInputDbm = fullScaleDbm - c.snrDb - processingGainDb;
  const noiseAtAntennaDbm = noiseAtInputDbm - c.gainDb;
  const kTB = BOLTZMANN * c.temperatureK * c.processingBandwidthHz;
  const frontEndW = kTB * pow(10, c.frontEndNfDb / 10);
  const frontEndNoiseAtAntennaDbm = dbm(frontEndW);
  const totalAtAntennaW = frontEndW + fromDbm(noiseAtAntennaDbm);
  const systemNfDb = 10 * log10(totalAtAntennaW / kTB);
  const headroomDb = fullScaleDbm - (c.strongestDbm + c.gainDb);
  const dynamicRangeDb = fullScaleDbm - (dbm(totalAtAntennaW) + c.gainDb);
  const signalRangeDb = c.strongestDbm - (dbm(totalAtAntennaW) + c.requiredSnrDb);
  return {
    fullScaleDbm,
    snrDb: c.snrDb,
    processingBandwidthHz: c.processingBandwidthHz,
    processingGainDb,
    noiseAtInputDbm,
    noiseAtAntennaDbm,
    frontEndNoiseAtAntennaDbm,
    converterSetsFloor: noiseAtAntennaDbm > frontEndNoiseAtAntennaDbm,
    systemNfDb,
    headroomDb,
    clips: headroomDb < 0,
    dynamicRangeDb,
    signalRangeDb,
    agcRangeDb: Math.max(0, signalRangeDb + c.requiredSnrDb - dynamicRangeDb),
  };
}
