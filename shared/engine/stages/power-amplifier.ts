/**
 * The transmitter's power amplifier as the source of a transmit path. The load it needs
 * follows from the power wanted and the voltage swing allowed: R = V²peak / (2·P), the
 * Class-A/B load-line formula (common practice; Vpeak = supply − knee voltage for a stage
 * fed through a choke). It is modelled as an EMF of 2·Vpeak behind R: into a load of R it
 * delivers exactly P with a swing of Vpeak, and the power falls off as the network's match
 * to R degrades. The harmonics its nonlinearity makes are not modelled: the transmit
 * analysis states how much the output network attenuates them.
 */
import { StageParameterError } from '../errors';
import type { StageDefinition } from '../types';
import { constantFn, enumParam, numParam, readParams, SpiceWriter, spiceNum } from './common';

const bySupply = { key: 'swingFrom', equals: 'supply' };
const PA_PARAMS = [
  numParam('powerW', 'Output power wanted', 'watt', 0.1, {
    min: 0,
    exclusiveMin: true,
    max: 2000,
    typical: { min: 1e-4, max: 100 },
  }),
  enumParam('swingFrom', 'Voltage swing from', [
    ['supply', 'Supply voltage (less the knee)'],
    ['peak', 'Allowed peak swing'],
  ]),
  numParam('supplyV', 'Supply voltage', 'volt', 3, {
    min: 0,
    exclusiveMin: true,
    max: 1000,
    showWhen: bySupply,
  }),
  numParam('kneeV', 'Knee (saturation) voltage', 'volt', 0, {
    min: 0,
    max: 100,
    showWhen: bySupply,
    help: 'Voltage the device cannot swing down to; 0 for the ideal load line.',
  }),
  numParam('peakV', 'Allowed peak swing', 'volt', 3, {
    min: 0,
    exclusiveMin: true,
    max: 1000,
    showWhen: { key: 'swingFrom', equals: 'peak' },
  }),
];

/** Peak swing and load resistance of a power amplifier's values. */
export function paLoadLine(values: { powerW: number; peakV: number }): {
  peakV: number;
  loadOhm: number;
} {
  return { peakV: values.peakV, loadOhm: (values.peakV * values.peakV) / (2 * values.powerW) };
}

/** Power amplifier: the source of a transmit path. */
export const POWER_AMPLIFIER: StageDefinition = {
  type: 'power-amplifier',
  category: 'source',
  role: 'source',
  label: 'Power amplifier',
  summary:
    'The transmitter: its power and voltage swing give the load it needs, R = V²peak/(2P), for the network to match to.',
  params: PA_PARAMS,
  cautions: ['transmit', 'rf-exposure'],
  build(values) {
    const p = readParams(PA_PARAMS, values);
    const peakV = p.str('swingFrom') === 'peak' ? p.num('peakV') : p.num('supplyV') - p.num('kneeV'); // prettier-ignore
    if (!(peakV > 0))
      throw new StageParameterError('kneeV', `the knee voltage must be below the supply (it leaves ${peakV} V of swing)`); // prettier-ignore
    const { loadOhm } = paLoadLine({ powerW: p.num('powerW'), peakV });
    const emf = 2 * peakV;
    return {
      emf: () => emf,
      impedance: constantFn(loadOhm),
      spice(_in, outNode, prefix) {
        const w = new SpiceWriter(prefix);
        const e = w.node();
        w.raw(`V${prefix} ${e} 0 DC 0 AC ${spiceNum(emf)}`);
        w.resistor(e, outNode, loadOhm);
        return w.lines;
      },
    };
  },
};
