/**
 * What the budget table shows per node, one specification per line: the label, how the
 * cell is written for the screen (the user's significant figures, prefixes and units) and
 * the SI series the CSV carries at full precision.
 */
import type { StageReport } from '../../../../../shared/engine/types';
import type { Point, RowSpec } from './budget-types';
import {
  NO_VALUE,
  decibels,
  degrees,
  engineering,
  impedancePolar,
  nominalEngineering,
  impedanceRect,
  plain,
  times,
} from './format-quantity';

/** Shown where VSWR and return loss need a reference the user has not chosen. */
const NO_REFERENCE = 'no reference set';

/** A noise temperature in kelvin, to the user's significant figures. */
const kelvin = (k: number | null | undefined) =>
  k === null || k === undefined || !Number.isFinite(k) ? NO_VALUE : `${plain(k)} K`;

const ofStage =
  (pick: (s: StageReport) => number | null) =>
  (p: Point): number | null =>
    p.stage ? pick(p.stage) : null;

const IMPEDANCE: RowSpec[] = [
  {
    key: 'zin-rect',
    label: 'Z looking in',
    note: 'toward the load, R + jX',
    display: (p) => impedanceRect(p.node.zIn),
    csv: [
      { label: 'Z looking in, R', unit: 'ohm', value: (p) => p.node.zIn.re },
      { label: 'Z looking in, X', unit: 'ohm', value: (p) => p.node.zIn.im },
    ],
  },
  {
    key: 'zin-polar',
    label: 'Z looking in',
    note: '|Z| ∠ phase',
    display: (p) => impedancePolar(p.node.zIn),
    csv: [],
  },
  {
    key: 'zsrc-rect',
    label: 'Z looking back',
    note: 'toward the source, R + jX',
    display: (p) => impedanceRect(p.node.zSrc),
    csv: [
      { label: 'Z looking back, R', unit: 'ohm', value: (p) => p.node.zSrc.re },
      { label: 'Z looking back, X', unit: 'ohm', value: (p) => p.node.zSrc.im },
    ],
  },
  {
    key: 'zsrc-polar',
    label: 'Z looking back',
    note: '|Z| ∠ phase',
    display: (p) => impedancePolar(p.node.zSrc),
    csv: [],
  },
];

const VOLTAGE: RowSpec[] = [
  {
    key: 'stepup',
    label: 'Voltage step-up',
    note: '|V| / EMF',
    display: (p) => `${times(p.node.stepUp)}  (${decibels(p.node.stepUpDb)})`,
    csv: [
      { label: 'Voltage step-up', unit: 'V/V', value: (p) => p.node.stepUp },
      { label: 'Voltage step-up', unit: 'dB', value: (p) => p.node.stepUpDb },
    ],
  },
  {
    key: 'v-rms',
    label: 'Node voltage',
    note: 'rms, at the input level',
    display: (p) => `${engineering(p.node.vRms, 'volt')} rms`,
    csv: [{ label: 'Node voltage, rms', unit: 'V', value: (p) => p.node.vRms }],
  },
  {
    key: 'v-peak',
    label: 'Node voltage',
    note: 'peak (engine phasor)',
    display: (p) => `${engineering(p.node.vPeak, 'volt')} pk ∠${degrees(p.node.phaseDeg)}`,
    csv: [
      { label: 'Node voltage, peak', unit: 'V', value: (p) => p.node.vPeak },
      { label: 'Node voltage, phase', unit: 'deg', value: (p) => p.node.phaseDeg },
    ],
  },
];

const GAIN: RowSpec[] = [
  {
    key: 'gain-stage-v',
    label: 'Stage voltage gain',
    note: 'stage ending here',
    display: (p) => (p.stage ? decibels(p.stage.voltageGainDb) : NO_VALUE),
    csv: [{ label: 'Stage voltage gain', unit: 'dB', value: ofStage((s) => s.voltageGainDb) }],
  },
  {
    key: 'gain-cum-v',
    label: 'Cumulative voltage gain',
    note: 'from the first node',
    display: (p) => (p.stage ? decibels(p.stage.cumulativeVoltageGainDb) : NO_VALUE),
    csv: [
      {
        label: 'Cumulative voltage gain',
        unit: 'dB',
        value: ofStage((s) => s.cumulativeVoltageGainDb),
      },
    ],
  },
  {
    key: 'gain-stage-a',
    label: 'Stage available gain',
    note: 'at the impedances it sees',
    display: (p) => (p.stage ? decibels(p.stage.availableGainDb) : NO_VALUE),
    csv: [{ label: 'Stage available gain', unit: 'dB', value: ofStage((s) => s.availableGainDb) }],
  },
  {
    key: 'gain-stage-t',
    label: 'Stage transducer gain',
    display: (p) => (p.stage ? decibels(p.stage.transducerGainDb) : NO_VALUE),
    csv: [
      { label: 'Stage transducer gain', unit: 'dB', value: ofStage((s) => s.transducerGainDb) },
    ],
  },
  {
    key: 'gain-cum-a',
    label: 'Cumulative available gain',
    display: (p) => (p.stage ? decibels(p.stage.cumulativeGainDb) : NO_VALUE),
    csv: [
      { label: 'Cumulative available gain', unit: 'dB', value: ofStage((s) => s.cumulativeGainDb) },
    ],
  },
  {
    key: 'gain-cum-t',
    label: 'Transducer gain',
    note: 'source to this node',
    display: (p) => decibels(p.node.transducerGainDb),
    csv: [
      {
        label: 'Transducer gain, source to node',
        unit: 'dB',
        value: (p) => p.node.transducerGainDb,
      },
    ],
  },
];

const NOISE: RowSpec[] = [
  {
    key: 'nf-stage',
    label: 'Stage noise figure',
    display: (p) => (p.stage ? decibels(p.stage.noiseFigureDb) : NO_VALUE),
    csv: [{ label: 'Stage noise figure', unit: 'dB', value: ofStage((s) => s.noiseFigureDb) }],
  },
  {
    key: 'nf-cum',
    label: 'Cumulative noise figure',
    note: 'Friis, to this node',
    display: (p) => (p.stage ? decibels(p.stage.cumulativeNoiseFigureDb) : NO_VALUE),
    csv: [
      {
        label: 'Cumulative noise figure',
        unit: 'dB',
        value: ofStage((s) => s.cumulativeNoiseFigureDb),
      },
    ],
  },
  {
    key: 'te-stage',
    label: 'Stage noise temperature',
    note: 'Te = T0·(F − 1), input',
    display: (p) => (p.stage ? kelvin(p.stage.noiseTemperatureK) : NO_VALUE),
    csv: [{ label: 'Stage noise temperature', unit: 'K', value: ofStage((s) => s.noiseTemperatureK) }], // prettier-ignore
  },
  {
    key: 'te-cum',
    label: 'Cumulative noise temperature',
    note: 'input-referred, to this node',
    display: (p) => (p.stage ? kelvin(p.stage.cumulativeNoiseTemperatureK) : NO_VALUE),
    csv: [
      {
        label: 'Cumulative noise temperature',
        unit: 'K',
        value: ofStage((s) => s.cumulativeNoiseTemperatureK),
      },
    ],
  },
  {
    key: 'te-out',
    label: 'Output noise temperature',
    note: 'G·(T source + Te) at this node',
    display: (p) => (p.stage ? kelvin(p.stage.outputNoiseTemperatureK) : NO_VALUE),
    csv: [
      {
        label: 'Output noise temperature',
        unit: 'K',
        value: ofStage((s) => s.outputNoiseTemperatureK),
      },
    ],
  },
  {
    key: 'iip3-stage',
    label: 'Stage IIP3',
    display: (p) => decibels(p.stage?.iip3Dbm, 'dBm'),
    csv: [{ label: 'Stage IIP3', unit: 'dBm', value: ofStage((s) => s.iip3Dbm) }],
  },
  {
    key: 'iip3-cum',
    label: 'Cumulative IIP3',
    note: 'referred to the chain input',
    display: (p) => decibels(p.stage?.cumulativeIip3Dbm, 'dBm'),
    csv: [{ label: 'Cumulative IIP3', unit: 'dBm', value: ofStage((s) => s.cumulativeIip3Dbm) }],
  },
  {
    key: 'p1db-stage',
    label: 'Stage input P1dB',
    display: (p) => decibels(p.stage?.p1dbDbm, 'dBm'),
    csv: [{ label: 'Stage input P1dB', unit: 'dBm', value: ofStage((s) => s.p1dbDbm) }],
  },
  {
    key: 'p1db-cum',
    label: 'Cumulative input P1dB',
    display: (p) => decibels(p.stage?.cumulativeP1dbDbm, 'dBm'),
    csv: [
      { label: 'Cumulative input P1dB', unit: 'dBm', value: ofStage((s) => s.cumulativeP1dbDbm) },
    ],
  },
];

const LEVEL: RowSpec[] = [
  {
    key: 'level-delivered',
    label: 'Signal level',
    note: 'delivered into the node',
    display: (p) => decibels(p.node.deliveredDbm, 'dBm'),
    csv: [{ label: 'Signal level, delivered', unit: 'dBm', value: (p) => p.node.deliveredDbm }],
  },
  {
    key: 'level-available',
    label: 'Signal level',
    note: 'available at the node',
    display: (p) => decibels(p.node.availableDbm, 'dBm'),
    csv: [{ label: 'Signal level, available', unit: 'dBm', value: (p) => p.node.availableDbm }],
  },
  {
    key: 'level-volts',
    label: 'Signal level',
    note: 'rms volts at the node',
    display: (p) => `${engineering(p.node.vRms, 'volt')} rms`,
    csv: [{ label: 'Signal level, rms volts', unit: 'V', value: (p) => p.node.vRms }],
  },
  {
    key: 'level-reference',
    label: 'Signal level',
    note: 'dBm-equivalent across the chosen reference',
    display: (p) =>
      p.node.referenceOhm === null
        ? NO_REFERENCE
        : `${decibels(p.node.referenceLevelDbm, 'dBm')} in ${nominalEngineering(p.node.referenceOhm, 'ohm')}`,
    csv: [
      {
        label: 'Signal level across the reference',
        unit: 'dBm',
        value: (p) => p.node.referenceLevelDbm,
      },
    ],
  },
];

const MATCH: RowSpec[] = [
  {
    key: 'mismatch',
    label: 'Mismatch loss',
    display: (p) => decibels(p.node.mismatchLossDb),
    csv: [{ label: 'Mismatch loss', unit: 'dB', value: (p) => p.node.mismatchLossDb }],
  },
  {
    key: 'return-loss',
    label: 'Return loss',
    note: 'against the chosen reference',
    display: (p) =>
      p.node.referenceOhm === null
        ? NO_REFERENCE
        : `${decibels(p.node.returnLossDb)} re ${nominalEngineering(p.node.referenceOhm, 'ohm')}`,
    csv: [{ label: 'Return loss against the reference', unit: 'dB', value: (p) => p.node.returnLossDb }], // prettier-ignore
  },
  {
    key: 'vswr',
    label: 'VSWR',
    note: 'against the chosen reference',
    display: (p) =>
      p.node.referenceOhm === null
        ? NO_REFERENCE
        : Number.isFinite(p.node.vswr)
          ? `${plain(p.node.vswr as number)} : 1`
          : '∞',
    csv: [{ label: 'VSWR against the reference', unit: 'ratio', value: (p) => p.node.vswr }],
  },
];

/** The budget's groups of quantity lines, top to bottom. */
export const BUDGET_GROUPS: { key: string; label: string; rows: RowSpec[] }[] = [
  { key: 'impedance', label: 'Impedance', rows: IMPEDANCE },
  { key: 'voltage', label: 'Voltage', rows: VOLTAGE },
  { key: 'gain', label: 'Gain', rows: GAIN },
  { key: 'noise', label: 'Noise and linearity', rows: NOISE },
  { key: 'level', label: 'Level plan', rows: LEVEL },
  { key: 'match', label: 'Match', rows: MATCH },
];
