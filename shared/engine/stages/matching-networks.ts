/**
 * Three-element and wider-band matching networks: low-pass pi, low-pass T, two cascaded
 * L-sections, and the tapped-capacitor transformer.
 */
import { StageParameterError } from '../errors';
import type { ParamSpec, StageDefinition } from '../types';
import { enumParam, reciprocalOf, sumOf } from './common';
import { elementFn, type LadderElement } from './ladder';
import { buildMatching, componentParam, matchingParams } from './matching-common';

/** The same specs with other default design resistances. */
function withDefaults(r1: number, r2: number, specs: ParamSpec[]): ParamSpec[] {
  return specs.map((s) =>
    s.key === 'r1' ? { ...s, default: r1 } : s.key === 'r2' ? { ...s, default: r2 } : s,
  );
}

const PI_PARAMS = withDefaults(1000, 50, [
  ...matchingParams(true, 10),
  componentParam('c1', 'Port-1 shunt capacitor C1', 'farad', 159.15e-12),
  componentParam('l', 'Series inductor L', 'henry', 1.8929e-6),
  componentParam('c2', 'Port-2 shunt capacitor C2', 'farad', 640.59e-12),
]);

/** Low-pass pi: C1 across port 1, series L, C2 across port 2. */
export const PI_MATCH: StageDefinition = {
  type: 'pi-match',
  category: 'matching',
  role: 'two-port',
  label: 'Pi match',
  summary: 'Shunt C, series L, shunt C: a match whose Q (bandwidth) you choose.',
  params: PI_PARAMS,
  build(values, ctx) {
    return buildMatching(
      PI_PARAMS,
      values,
      ctx,
      () => 'pi',
      (v, p) => [
        { part: 'C', place: 'shunt', value: v.c1, q: p.num('qc') },
        { part: 'L', place: 'series', value: v.l, q: p.num('ql') },
        { part: 'C', place: 'shunt', value: v.c2, q: p.num('qc') },
      ],
      ['c1', 'l', 'c2'],
    );
  },
};

const T_PARAMS = withDefaults(10, 50, [
  ...matchingParams(true, 5),
  componentParam('l1', 'Port-1 series inductor L1', 'henry', 79.58e-9),
  componentParam('c', 'Shunt capacitor C', 'farad', 43.15e-12),
  componentParam('l2', 'Port-2 series inductor L2', 'henry', 163.09e-9),
]);

/** Low-pass T: series L1, shunt C, series L2. */
export const T_MATCH: StageDefinition = {
  type: 't-match',
  category: 'matching',
  role: 'two-port',
  label: 'T match',
  summary: 'Series L, shunt C, series L: a match whose Q you choose, with no shunt path at port 2.',
  params: T_PARAMS,
  build(values, ctx) {
    return buildMatching(
      T_PARAMS,
      values,
      ctx,
      () => 't',
      (v, p) => [
        { part: 'L', place: 'series', value: v.l1, q: p.num('ql') },
        { part: 'C', place: 'shunt', value: v.c, q: p.num('qc') },
        { part: 'L', place: 'series', value: v.l2, q: p.num('ql') },
      ],
      ['l1', 'c', 'l2'],
    );
  },
};

const DOUBLE_L_PARAMS = [
  enumParam('form', 'Form', [
    ['step-up', 'Series L first (steps up)'],
    ['step-down', 'Shunt C first (steps down)'],
  ]),
  ...matchingParams(false),
  componentParam('l1', 'First inductor L1', 'henry', 1.1e-6),
  componentParam('c1', 'First capacitor C1', 'farad', 580e-12),
  componentParam('l2', 'Second inductor L2', 'henry', 4.9e-6),
  componentParam('c2', 'Second capacitor C2', 'farad', 130e-12),
];

/** Two low-pass L-sections in cascade through the geometric-mean resistance. */
export const DOUBLE_L_MATCH: StageDefinition = {
  type: 'double-l-match',
  category: 'matching',
  role: 'two-port',
  label: 'Two-section L match',
  summary: 'Two L-sections in cascade through √(R1·R2): lower Q and a wider band than one.',
  params: DOUBLE_L_PARAMS,
  build(values, ctx) {
    return buildMatching(
      DOUBLE_L_PARAMS,
      values,
      ctx,
      () => 'double-l',
      (v, p) => {
        const ql = p.num('ql');
        const qc = p.num('qc');
        const l1: LadderElement = { part: 'L', place: 'series', value: v.l1, q: ql };
        const c1: LadderElement = { part: 'C', place: 'shunt', value: v.c1, q: qc };
        const l2: LadderElement = { part: 'L', place: 'series', value: v.l2, q: ql };
        const c2: LadderElement = { part: 'C', place: 'shunt', value: v.c2, q: qc };
        return p.str('form') === 'step-up' ? [l1, c1, l2, c2] : [c1, l1, c2, l2];
      },
      ['l1', 'c1', 'l2', 'c2'],
      (design, p) => {
        const want = design.shuntAt === 'port1' ? 'step-down' : 'step-up';
        if (p.str('form') !== want) {
          throw new StageParameterError(
            'form',
            `R1 = ${p.num('r1')} Ω to R2 = ${p.num('r2')} Ω needs the ${want} form`,
          );
        }
      },
    );
  },
};

const TAPPED_C_PARAMS = withDefaults(5000, 50, [
  ...matchingParams(true, 10),
  componentParam('l', 'Tank inductor L', 'henry', 2.786e-6),
  componentParam('c1', 'Top capacitor C1', 'farad', 100e-12),
  componentParam('c2', 'Tap capacitor C2', 'farad', 900e-12),
]);

/** Tank L across port 1, C1 down to the tap, C2 from the tap to ground; port 2 at the tap. */
export const TAPPED_C_MATCH: StageDefinition = {
  type: 'tapped-c-match',
  category: 'matching',
  role: 'two-port',
  label: 'Tapped-capacitor transformer',
  summary: 'A tuned tank whose capacitance is split to tap a low resistance off a high one.',
  params: TAPPED_C_PARAMS,
  build(values, ctx) {
    let tank: LadderElement[] = [];
    const model = buildMatching(
      TAPPED_C_PARAMS,
      values,
      ctx,
      () => 'tapped-c',
      (v, p) => {
        tank = [
          { part: 'L', place: 'shunt', value: v.l, q: p.num('ql') },
          { part: 'C', place: 'series', value: v.c1, q: p.num('qc') },
          { part: 'C', place: 'shunt', value: v.c2, q: p.num('qc') },
        ];
        return tank;
      },
      ['l', 'c1', 'c2'],
    );
    // The tank's own admittance: L in parallel with C1 and C2 in series (load removed).
    const c1c2 = sumOf(elementFn(tank[1]), elementFn({ ...tank[2], place: 'series' }));
    const own = sumOf(elementFn(tank[0]), reciprocalOf(c1c2));
    return {
      ...model,
      resonators: [{ kind: 'shunt', label: 'tank', node: 1, ownAdmittance: own }],
    };
  },
};
