/**
 * Two-resonator coupled bandpass: two identical parallel tanks coupled by a small top
 * capacitor or by mutual inductance between their coils.
 */
import type { Section, StageDefinition } from '../types';
import {
  capacitorYFn,
  capacitorZFn,
  enumParam,
  inductorYFn,
  numParam,
  qParam,
  readParams,
  seriesSection,
  shuntSection,
  SpiceWriter,
  sumOf,
  sectionFromFill,
} from './common';
import { fillCoupledInductors } from './primitives';

const PARAMS = [
  enumParam('coupling', 'Coupling', [
    ['top-c', 'Top capacitor between the tanks'],
    ['mutual', 'Mutual inductance between the coils'],
  ]),
  numParam('l', 'Coil inductance (each tank)', 'henry', 1e-6, {
    min: 0,
    exclusiveMin: true,
    tolerance: true,
  }),
  numParam('c', 'Tuning capacitance (each tank)', 'farad', 250e-12, {
    min: 0,
    exclusiveMin: true,
    tolerance: true,
    help: 'With top-capacitor coupling each tank also sees the coupling capacitor.',
  }),
  qParam('ql', 'Coil Q', 100),
  qParam('qc', 'Capacitor Q', 1000),
  numParam('cc', 'Coupling capacitor', 'farad', 3.3e-12, {
    min: 0,
    exclusiveMin: true,
    tolerance: true,
    showWhen: { key: 'coupling', equals: 'top-c' },
    help: 'Coupling k ≈ Cc/C; critical coupling is k = 1/Q (loaded).',
  }),
  numParam('k', 'Coupling coefficient', 'ratio', 0.01, {
    min: 0,
    exclusiveMin: true,
    max: 1,
    showWhen: { key: 'coupling', equals: 'mutual' },
    help: 'Critical coupling is k = 1/Q (loaded).',
  }),
];

/** Two coupled tanks; both are declared as resonators. */
export const COUPLED_BANDPASS: StageDefinition = {
  type: 'coupled-bandpass',
  category: 'filter',
  role: 'two-port',
  label: 'Two-tank coupled bandpass',
  summary: 'Two tuned circuits coupled lightly: a flatter top and steeper skirts than one tank.',
  params: PARAMS,
  build(values) {
    const p = readParams(PARAMS, values);
    const [l, c, ql, qc] = [p.num('l'), p.num('c'), p.num('ql'), p.num('qc')];
    const own = sumOf(inductorYFn(l, ql), capacitorYFn(c, qc));
    // With top-capacitor coupling each tank resonates with its own C plus the coupling
    // capacitor (the usual design rule: C_tank = C_resonant − Cc), so that is the tank
    // whose resonance and stored energy the Q figures describe.
    const tankY = p.str('coupling') === 'top-c' ? sumOf(own, capacitorYFn(p.num('cc'), qc)) : own;
    const resonators = [
      {
        kind: 'shunt' as const,
        label: 'first tank',
        node: 1,
        ownAdmittance: tankY,
        coupledPartner: 'downstream' as const,
      },
      {
        kind: 'shunt' as const,
        label: 'second tank',
        node: 3,
        ownAdmittance: tankY,
        coupledPartner: 'upstream' as const,
      },
    ];
    if (p.str('coupling') === 'top-c') {
      const cc = p.num('cc');
      return {
        sections: [shuntSection(own), seriesSection(capacitorZFn(cc, qc)), shuntSection(own)],
        resonators,
        noise: { kind: 'passive' },
        spice(inNode, outNode, prefix) {
          const w = new SpiceWriter(prefix);
          for (const node of [inNode, outNode]) {
            w.inductor(node, '0', l, ql);
            w.capacitor(node, '0', c, qc);
          }
          w.capacitor(inNode, outNode, cc, qc);
          return w.lines;
        },
      };
    }
    const k = p.num('k');
    const coils: Section = sectionFromFill((f, fo, n, out, oo) =>
      fillCoupledInductors(l, l, k, ql, ql, f, fo, n, out, oo),
    );
    const cap = capacitorYFn(c, qc);
    return {
      sections: [shuntSection(cap), coils, shuntSection(cap)],
      resonators,
      noise: { kind: 'passive' },
      spice(inNode, outNode, prefix) {
        const w = new SpiceWriter(prefix);
        const a = w.inductor(inNode, '0', l, ql);
        const b = w.inductor(outNode, '0', l, ql);
        w.couple(a, b, k);
        w.capacitor(inNode, '0', c, qc);
        w.capacitor(outNode, '0', c, qc);
        return w.lines;
      },
    };
  },
};
