/**
 * Single components and simple LC resonators: a series or shunt R, L or C; a series LC;
 * a shunt (parallel) LC tank.
 */
import type { ComplexFn, StageDefinition } from '../types';
import {
  capacitorYFn,
  capacitorZFn,
  constantFn,
  enumParam,
  inductorYFn,
  inductorZFn,
  numParam,
  qParam,
  readParams,
  seriesSection,
  shuntSection,
  SpiceWriter,
  sumOf,
} from './common';

const ELEMENT_PARAMS = [
  enumParam('position', 'Position', [
    ['series', 'In series with the signal path'],
    ['shunt', 'Across the signal path (to ground)'],
  ]),
  enumParam('element', 'Component', [
    ['inductor', 'Inductor'],
    ['capacitor', 'Capacitor'],
    ['resistor', 'Resistor'],
  ]),
  numParam('l', 'Inductance', 'henry', 1e-6, {
    min: 0,
    exclusiveMin: true,
    tolerance: true,
    showWhen: { key: 'element', equals: 'inductor' },
  }),
  qParam('ql', 'Coil Q', 100, { showWhen: { key: 'element', equals: 'inductor' } }),
  numParam('esr', 'Coil series resistance', 'ohm', 0, {
    min: 0,
    help: 'A fixed series resistance instead of the Q; 0 uses the Q.',
    showWhen: { key: 'element', equals: 'inductor' },
  }),
  numParam('c', 'Capacitance', 'farad', 100e-12, {
    min: 0,
    exclusiveMin: true,
    tolerance: true,
    showWhen: { key: 'element', equals: 'capacitor' },
  }),
  qParam('qc', 'Capacitor Q', 1000, { showWhen: { key: 'element', equals: 'capacitor' } }),
  numParam('r', 'Resistance', 'ohm', 50, {
    min: 0,
    exclusiveMin: true,
    tolerance: true,
    showWhen: { key: 'element', equals: 'resistor' },
  }),
];

/** One R, L or C, in series or across the line. */
export const LUMPED_ELEMENT: StageDefinition = {
  type: 'lumped-element',
  category: 'element',
  role: 'two-port',
  label: 'Single component',
  summary: 'One resistor, inductor or capacitor, in series with the path or across it.',
  params: ELEMENT_PARAMS,
  build(values) {
    const p = readParams(ELEMENT_PARAMS, values);
    const element = p.str('element');
    const series = p.str('position') === 'series';
    const esr = p.num('esr') > 0 ? p.num('esr') : -1;
    let z: ComplexFn;
    let y: ComplexFn;
    if (element === 'inductor') {
      z = inductorZFn(p.num('l'), p.num('ql'), esr);
      y = inductorYFn(p.num('l'), p.num('ql'), esr);
    } else if (element === 'capacitor') {
      z = capacitorZFn(p.num('c'), p.num('qc'));
      y = capacitorYFn(p.num('c'), p.num('qc'));
    } else {
      z = constantFn(p.num('r'));
      y = constantFn(1 / p.num('r'));
    }
    const emit = (w: SpiceWriter, a: string, b: string) => {
      if (element === 'inductor') w.inductor(a, b, p.num('l'), p.num('ql'), esr);
      else if (element === 'capacitor') w.capacitor(a, b, p.num('c'), p.num('qc'));
      else w.resistor(a, b, p.num('r'));
    };
    return {
      sections: [series ? seriesSection(z) : shuntSection(y)],
      noise: { kind: 'passive' },
      spice(inNode, outNode, prefix) {
        const w = new SpiceWriter(prefix);
        if (series) emit(w, inNode, outNode);
        else {
          emit(w, inNode, '0');
          w.wire(inNode, outNode);
        }
        return w.lines;
      },
    };
  },
};

const LC_PARAMS = [
  numParam('l', 'Inductance', 'henry', 1e-6, { min: 0, exclusiveMin: true, tolerance: true }),
  qParam('ql', 'Coil Q', 100),
  numParam('c', 'Capacitance', 'farad', 253.3e-12, {
    min: 0,
    exclusiveMin: true,
    tolerance: true,
    help: 'Resonates 1 µH at about 10 MHz by default.',
  }),
  qParam('qc', 'Capacitor Q', 1000),
];

/** Series LC resonator in the signal path. */
export const SERIES_LC: StageDefinition = {
  type: 'series-lc',
  category: 'filter',
  role: 'two-port',
  label: 'Series LC',
  summary: 'A coil and capacitor in series with the path: passes its resonance, blocks the rest.',
  params: LC_PARAMS,
  build(values) {
    const p = readParams(LC_PARAMS, values);
    const z = sumOf(inductorZFn(p.num('l'), p.num('ql')), capacitorZFn(p.num('c'), p.num('qc')));
    return {
      sections: [seriesSection(z)],
      resonators: [{ kind: 'series', label: 'series LC', section: 0, ownImpedance: z }],
      noise: { kind: 'passive' },
      spice(inNode, outNode, prefix) {
        const w = new SpiceWriter(prefix);
        const mid = w.node();
        w.inductor(inNode, mid, p.num('l'), p.num('ql'));
        w.capacitor(mid, outNode, p.num('c'), p.num('qc'));
        return w.lines;
      },
    };
  },
};

/** Parallel LC tank across the line. */
export const SHUNT_LC_TANK: StageDefinition = {
  type: 'shunt-lc-tank',
  category: 'filter',
  role: 'two-port',
  label: 'Parallel LC tank',
  summary: 'A coil and capacitor in parallel across the path: a tuned circuit at its node.',
  params: LC_PARAMS,
  build(values) {
    const p = readParams(LC_PARAMS, values);
    const y = sumOf(inductorYFn(p.num('l'), p.num('ql')), capacitorYFn(p.num('c'), p.num('qc')));
    return {
      sections: [shuntSection(y)],
      resonators: [{ kind: 'shunt', label: 'tank', node: 1, ownAdmittance: y }],
      noise: { kind: 'passive' },
      spice(inNode, outNode, prefix) {
        const w = new SpiceWriter(prefix);
        w.inductor(inNode, '0', p.num('l'), p.num('ql'));
        w.capacitor(inNode, '0', p.num('c'), p.num('qc'));
        w.wire(inNode, outNode);
        return w.lines;
      },
    };
  },
};
