/**
 * A small, self-consistent chain and analysis for the results panel's specs: antenna →
 * preselector tank → LNA → mixer (10 MHz to 455 kHz, LO high) → IF filter → detector.
 * Numbers are plausible, not computed by the engine; the specs check how they are shown.
 */
import type { ChainDocument } from '../../../../../../shared/schema/chain';
import type {
  AnalysisResult,
  NodeReport,
  StageReport,
} from '../../../../../../shared/engine/types';

export const SAMPLE_F0 = 10e6;
export const SAMPLE_IMAGE = 10.91e6;

export function sampleDocument(): ChainDocument {
  return {
    format: 'chainwright-chain',
    formatVersion: 1,
    name: 'Ten metre, "first" try',
    description: '',
    settings: {
      f0Hz: SAMPLE_F0,
      sweep: { startHz: 9e6, stopHz: 11e6, points: 21, scale: 'lin' },
      temperatureK: 290,
      channelBandwidthHz: 10e3,
      requiredSnrDb: 10,
      offsetsHz: [100e3],
      thresholds: {
        loadingWarn: 0.5,
        loadingError: 0.2,
        compressionBackoffDb: 3,
        matchReturnLossDb: 15,
        detuneFraction: 0.5,
        noiseMismatchVswr: 2,
        qBudgetLossDb: 1,
      },
    },
    stages: [
      { id: 'ant', type: 'resistive-source', label: 'Antenna', values: {} },
      { id: 'tank', type: 'shunt-lc-tank', label: 'Preselector', values: {} },
      { id: 'lna', type: 'amplifier', label: 'LNA', values: {} },
      { id: 'mix', type: 'mixer', label: 'Mixer', values: {} },
      { id: 'if', type: 'if-filter', label: 'IF filter', values: {} },
      { id: 'det', type: 'diode-detector', label: 'Detector', values: {} },
    ],
  };
}

function node(index: number, after: string, overrides: Partial<NodeReport>): NodeReport {
  return {
    index,
    after,
    zIn: { re: 50, im: 0 },
    zSrc: { re: 50, im: 0 },
    vPeak: 1e-3,
    vRms: 1e-3 / Math.SQRT2,
    phaseDeg: 0,
    stepUp: 0.5,
    stepUpDb: -6.02,
    deliveredW: 1e-8,
    availableW: 1e-8,
    deliveredDbm: -50,
    availableDbm: -50,
    transducerGainDb: 0,
    mismatch: 1,
    mismatchLossDb: 0,
    matchReturnLossDb: 40,
    referenceOhm: 50,
    returnLossDb: 40,
    vswr: 1.02,
    referenceLevelDbm: -50,
    ...overrides,
  };
}

function stage(
  id: string,
  label: string,
  fromNode: number,
  overrides: Partial<StageReport>,
): StageReport {
  return {
    id,
    type: id,
    label,
    fromNode,
    toNode: fromNode + 1,
    fInHz: SAMPLE_F0,
    fOutHz: SAMPLE_F0,
    voltageGainDb: 0,
    cumulativeVoltageGainDb: 0,
    availableGainDb: 0,
    transducerGainDb: 0,
    noiseFigureDb: 0,
    cumulativeNoiseFigureDb: 0,
    noiseTemperatureK: 0,
    cumulativeNoiseTemperatureK: 0,
    outputNoiseTemperatureK: 290,
    cumulativeGainDb: 0,
    iip3Dbm: null,
    cumulativeIip3Dbm: null,
    p1dbDbm: null,
    cumulativeP1dbDbm: null,
    inputLevelDbm: -50,
    ...overrides,
  };
}

/** Step-up (dB) of a single-tuned response with loaded Q `q` peaking at `peakDb`. */
function resonance(freqs: number[], peakDb: number, q: number): number[] {
  return freqs.map(
    (f) => peakDb - 10 * Math.log10(1 + ((2 * q * (f - SAMPLE_F0)) / SAMPLE_F0) ** 2),
  );
}

export function sampleResult(): AnalysisResult {
  const freqs = Array.from({ length: 21 }, (_, i) => 9e6 + i * 0.1e6);
  return {
    engineVersion: 'test',
    f0Hz: SAMPLE_F0,
    nodes: [
      node(0, 'Antenna', { zIn: { re: 48.2, im: -3.1 }, stepUpDb: -6.2, stepUp: 0.49 }),
      node(1, 'Preselector', {
        zIn: { re: 2400, im: 150 },
        zSrc: { re: 2150, im: -80 },
        vPeak: 14.1e-6,
        vRms: 10e-6,
        stepUp: 7.05,
        stepUpDb: 16.97,
        mismatchLossDb: 0.01,
        returnLossDb: 26.4,
      }),
      node(2, 'LNA', { vPeak: 1.41e-3, vRms: 1e-3, stepUp: 705, stepUpDb: 56.97 }),
      node(3, 'Mixer', { vPeak: 2.82e-3, vRms: 2e-3, stepUp: 1410, stepUpDb: 62.98 }),
      node(4, 'IF filter', {
        referenceOhm: null,
        returnLossDb: null,
        vswr: null,
        referenceLevelDbm: null,
        zIn: { re: 5000, im: -1200 },
        vPeak: 2.5e-3,
        vRms: 1.77e-3,
        stepUp: 1250,
        stepUpDb: 61.94,
      }),
    ],
    stages: [
      stage('tank', 'Preselector', 0, {
        voltageGainDb: 23.2,
        cumulativeVoltageGainDb: 23.2,
        availableGainDb: -0.8,
        noiseFigureDb: 0.8,
        cumulativeNoiseFigureDb: 0.8,
        cumulativeGainDb: -0.8,
      }),
      stage('lna', 'LNA', 1, {
        voltageGainDb: 40,
        cumulativeVoltageGainDb: 63.2,
        availableGainDb: 20,
        noiseFigureDb: 2,
        cumulativeNoiseFigureDb: 2.9,
        cumulativeGainDb: 19.2,
        iip3Dbm: 5,
        cumulativeIip3Dbm: 5.8,
        p1dbDbm: -5,
        cumulativeP1dbDbm: -4.2,
      }),
      stage('mix', 'Mixer', 2, {
        fOutHz: 455e3,
        voltageGainDb: 6,
        cumulativeVoltageGainDb: 69.2,
        availableGainDb: 6,
        noiseFigureDb: 10,
        cumulativeNoiseFigureDb: 3.3,
        cumulativeGainDb: 25.2,
        iip3Dbm: 10,
        cumulativeIip3Dbm: -9.4,
      }),
      stage('if', 'IF filter', 3, {
        fInHz: 455e3,
        fOutHz: 455e3,
        voltageGainDb: -1,
        cumulativeVoltageGainDb: 68.2,
        availableGainDb: -3,
        noiseFigureDb: 3,
        cumulativeNoiseFigureDb: 3.31,
        cumulativeGainDb: 22.2,
        cumulativeIip3Dbm: -9.4,
      }),
    ],
    resonators: [
      {
        stageId: 'tank',
        label: 'Tank',
        kind: 'shunt',
        node: 1,
        resonanceHz: 10.02e6,
        loadedQ: 25,
        unloadedQ: 180,
        bandwidthHz: 400.8e3,
        detachedQ: 90,
        detachedBandwidthHz: 111.3e3,
        loadingRatio: 0.28,
        downstreamShare: 0.72,
      },
      {
        stageId: 'if',
        label: 'IF resonator',
        kind: 'series',
        node: null,
        resonanceHz: null,
        loadedQ: null,
        unloadedQ: null,
        bandwidthHz: null,
        detachedQ: null,
        detachedBandwidthHz: null,
        loadingRatio: null,
        downstreamShare: null,
      },
    ],
    selectivity: [1, 4].map((n) => ({
      node: n,
      peakHz: SAMPLE_F0,
      peakStepUpDb: n === 1 ? 16.97 : 61.94,
      bw3dbHz: n === 1 ? 400e3 : 9e3,
      bw60dbHz: n === 1 ? null : 40e3,
      shapeFactor: n === 1 ? null : 4.44,
      offsets: [{ offsetHz: 100e3, belowDb: n === 1 ? 0.3 : 62.1, aboveDb: n === 1 ? 0.3 : 63 }],
      imageHz: n === 1 ? null : SAMPLE_IMAGE,
      imageRejectionDb: n === 1 ? null : 24.5,
    })),
    levels: {
      noiseFloorDbm: -134,
      noiseFigureDb: 3.31,
      noiseTemperatureK: 330.8,
      sourceNoiseTemperatureK: 290,
      systemNoiseTemperatureK: 620.8,
      totalGainDb: 22.2,
      sensitivityDbm: -120.7,
      sensitivityEmfRms: 0.41e-6,
      iip3Dbm: -9.4,
      sfdrDb: 83.1,
      inputAvailableDbm: -93,
    },
    flags: [
      {
        code: 'q-budget',
        severity: 'info',
        stageId: 'if',
        message: 'The IF filter needs a part Q of 60; its parts have 80.',
      },
      {
        code: 'tank-overloaded',
        severity: 'error',
        stageId: 'tank',
        message:
          'The LNA pulls the tank Q from 90 to 25 (ratio 0.28); bandwidth 111 kHz → 401 kHz.',
      },
      {
        code: 'detector-underdriven',
        severity: 'warning',
        stageId: 'det',
        message: 'The detector sees 2.5 mV peak; it needs 50 mV.',
      },
    ],
    sweep: {
      freqsHz: freqs,
      nodes: [0, 1, 2, 3, 4].map((index) => ({
        index,
        stepUpDb: resonance(freqs, [-6.2, 16.97, 56.97, 62.98, 61.94][index], index === 0 ? 0 : 25),
        phaseDeg: freqs.map(() => 0),
      })),
      zIn: { re: freqs.map(() => 48), im: freqs.map((f) => (f - SAMPLE_F0) / 1e5) },
      returnLossDb: freqs.map((f) => 30 - Math.abs(f - SAMPLE_F0) / 1e5),
    },
  };
}

type Transmit = NonNullable<AnalysisResult['transmit']>;

/** A transmit mode's report: the 2nd harmonic over its limit, one part over its rating. */
export function sampleTransmit(): Transmit {
  return {
    f0Hz: 433.92e6,
    availableW: 0.1,
    deliveredW: 0.0945,
    deliveredDbm: 19.75,
    networkLossDb: 0.25,
    sourceSwingPeakV: 2.98,
    harmonics: [
      { n: 2, fHz: 867.84e6, attenuationDb: 16.3, limitDb: 20, ok: false },
      { n: 3, fHz: 1301.76e6, attenuationDb: 30.9, limitDb: 20, ok: true },
    ],
    receiverInput: { stageId: 'rx-idle', part: 'part 5', powerW: 3.6e-5, dbm: -14.4, isolationDb: 34.2, limitDbm: null, ok: null }, // prettier-ignore
    parts: [
      { stageId: 'pa-match', label: 'PA match, part 1 (series)', vPeak: 1.01, iPeak: 0.067, iRms: 0.0474, powerW: 3.4e-4, ratedPeakVolts: null, ratedRmsAmps: null, ok: null }, // prettier-ignore
      { stageId: 'rx-idle', label: 'part 2 (series L)', vPeak: 3.07, iPeak: 0.0615, iRms: 0.0435, powerW: 0, ratedPeakVolts: 2, ratedRmsAmps: null, ok: false }, // prettier-ignore
    ],
  };
}
