/** A small stage catalogue of our own for editor specs: shapes only, no engine. */
import type { StageTypeInfo } from '../../../../../shared/engine/types';
import type { ChainDocument, StageInstance } from '../../../../../shared/schema/chain';

export const SOURCE: StageTypeInfo = {
  type: 'test-source',
  category: 'source',
  role: 'source',
  label: 'Test generator',
  summary: 'A resistive generator.',
  params: [
    {
      key: 'r',
      label: 'Resistance',
      kind: 'number',
      unit: 'ohm',
      default: 50,
      min: 0,
      exclusiveMin: true,
    },
  ],
};

export const TANK: StageTypeInfo = {
  type: 'test-tank',
  category: 'filter',
  role: 'two-port',
  label: 'Test tank',
  summary: 'A shunt LC tank.',
  params: [
    {
      key: 'l',
      label: 'Inductance',
      kind: 'number',
      unit: 'henry',
      default: 22e-6,
      min: 1e-9,
      tolerance: true,
    },
    {
      key: 'c',
      label: 'Capacitance',
      kind: 'number',
      unit: 'farad',
      default: 100e-12,
      min: 0,
      exclusiveMin: true,
    },
    {
      key: 'mode',
      label: 'Entry',
      kind: 'enum',
      unit: 'none',
      default: 'values',
      options: [
        { value: 'values', label: 'By values' },
        { value: 'design', label: 'Designed' },
      ],
    },
    {
      key: 'q',
      label: 'Loaded Q',
      kind: 'number',
      unit: 'ratio',
      default: 20,
      showWhen: { key: 'mode', equals: 'design' },
    },
    { key: 'lossy', label: 'Include losses', kind: 'boolean', unit: 'none', default: true },
  ],
};

export const AMP: StageTypeInfo = {
  type: 'test-amp',
  category: 'amplifier',
  role: 'two-port',
  label: 'Test amplifier',
  summary: 'A unilateral amplifier.',
  params: [{ key: 'gain', label: 'Gain', kind: 'number', unit: 'db', default: 20 }],
  presets: [{ key: 'low', label: 'Low gain', values: { gain: 10 } }],
  cautions: ['high-voltage'],
};

export const LOAD: StageTypeInfo = {
  type: 'test-load',
  category: 'load',
  role: 'load',
  label: 'Test load',
  summary: 'An R‖C load.',
  params: [
    {
      key: 'r',
      label: 'Resistance',
      kind: 'number',
      unit: 'ohm',
      default: 1e6,
      min: 0,
      exclusiveMin: true,
    },
  ],
};

export const CATALOGUE = [SOURCE, TANK, AMP, LOAD];

export function stage(
  id: string,
  type: StageTypeInfo,
  values: StageInstance['values'] = {},
): StageInstance {
  return { id, type: type.type, label: type.label, values };
}

export function sampleDocument(): ChainDocument {
  return {
    format: 'chainwright-chain',
    formatVersion: 1,
    name: 'Test chain',
    description: '',
    settings: {
      f0Hz: 1e6,
      sweep: { startHz: 5e5, stopHz: 2e6, points: 11, scale: 'lin' },
      temperatureK: 290,
      channelBandwidthHz: 10e3,
      requiredSnrDb: 10,
      offsetsHz: [],
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
    stages: [stage('src', SOURCE), stage('tank', TANK), stage('amp', AMP), stage('load', LOAD)],
  };
}
