/**
 * An RF switch contact, modelled as the network it is in each state: closed, its
 * on-resistance; open, its off-capacitance. In the path (series) or from the path to ground
 * (shunt). Its state is a parameter a mode sets: on/off, or one of several positions of a
 * selector (the contact is closed when the selector stands at this contact's position).
 */
import { StageParameterError } from '../errors';
import type { StageDefinition } from '../types';
import {
  capacitorYFn,
  capacitorZFn,
  constantFn,
  enumParam,
  LOSSLESS_Q,
  numParam,
  readParams,
  seriesSection,
  shuntSection,
  SpiceWriter,
} from './common';

/**
 * Off-capacitance of a contact whose isolation is `isoDb` at `hz`, isolation measured as a
 * series contact between two `z0` ports: |S21| = |2·z0/(2·z0 + Z)| with Z = 1/(jωC), so
 * |Z| = 2·z0·√(10^(iso/10) − 1) (two-port S21 of a series impedance; common practice).
 */
export function offCapacitanceForIsolation(isoDb: number, hz: number, z0: number): number {
  const x = 2 * z0 * Math.sqrt(10 ** (isoDb / 10) - 1);
  return 1 / (2 * Math.PI * hz * x);
}

const byIsolation = { key: 'offGiven', equals: 'isolation' };
const SWITCH_PARAMS = [
  enumParam('placement', 'Placement', [
    ['series', 'In the path (through contact)'],
    ['shunt', 'From the path to ground'],
  ]),
  enumParam('control', 'Set by', [
    ['on-off', 'On or off'],
    ['position', 'Selector position'],
  ]),
  enumParam(
    'state',
    'State',
    [
      ['on', 'On (contact closed)'],
      ['off', 'Off (contact open)'],
    ],
    { showWhen: { key: 'control', equals: 'on-off' }, help: 'Usually set per mode.' },
  ),
  numParam('position', 'Selector position', 'none', 1, {
    min: 1,
    max: 16,
    showWhen: { key: 'control', equals: 'position' },
    help: 'Where the selector stands (usually set per mode).',
  }),
  numParam('closesAt', 'This contact closes at position', 'none', 1, {
    min: 1,
    max: 16,
    showWhen: { key: 'control', equals: 'position' },
  }),
  numParam('ron', 'On-resistance', 'ohm', 1, { min: 0, exclusiveMin: true, max: 1e4 }),
  enumParam('offGiven', 'Off state given as', [
    ['capacitance', 'Off-capacitance'],
    ['isolation', 'Isolation at a frequency'],
  ]),
  numParam('coff', 'Off-capacitance', 'farad', 0.3e-12, {
    min: 0,
    exclusiveMin: true,
    max: 1e-6,
    showWhen: { key: 'offGiven', equals: 'capacitance' },
  }),
  numParam('isolationDb', 'Isolation', 'db', 25, {
    min: 0,
    exclusiveMin: true,
    max: 120,
    showWhen: byIsolation,
    help: 'Of the open contact, between two ports of the system impedance (as data sheets state it).',
  }),
  numParam('isolationHz', 'Isolation stated at', 'hertz', 1e9, {
    min: 0,
    exclusiveMin: true,
    showWhen: byIsolation,
  }),
  numParam('z0', 'System impedance of the isolation figure', 'ohm', 50, {
    min: 0,
    exclusiveMin: true,
    showWhen: byIsolation,
  }),
];

/** A switch contact in series with the path or from it to ground. */
export const RF_SWITCH: StageDefinition = {
  type: 'rf-switch',
  category: 'element',
  role: 'two-port',
  label: 'Switch contact',
  summary:
    'A switch in the path or to ground: its on-resistance when closed, its off-capacitance when open; modes set its state.',
  params: SWITCH_PARAMS,
  build(values) {
    const p = readParams(SWITCH_PARAMS, values);
    const position = p.num('position');
    if (p.str('control') === 'position' && !Number.isInteger(position))
      throw new StageParameterError('position', 'the selector position must be a whole number');
    const closed =
      p.str('control') === 'position' ? position === p.num('closesAt') : p.str('state') === 'on';
    const ron = p.num('ron');
    const coff =
      p.str('offGiven') === 'isolation'
        ? offCapacitanceForIsolation(p.num('isolationDb'), p.num('isolationHz'), p.num('z0'))
        : p.num('coff');
    const series = p.str('placement') === 'series';
    const section = series
      ? seriesSection(closed ? constantFn(ron) : capacitorZFn(coff, LOSSLESS_Q))
      : shuntSection(closed ? constantFn(1 / ron) : capacitorYFn(coff, LOSSLESS_Q));
    return {
      sections: [section],
      noise: { kind: 'passive' },
      spice(inNode, outNode, prefix) {
        const w = new SpiceWriter(prefix);
        const far = series ? outNode : '0';
        if (closed) w.resistor(inNode, far, ron);
        else w.capacitor(inNode, far, coff);
        if (!series) w.wire(inNode, outNode);
        return w.lines;
      },
    };
  },
};
