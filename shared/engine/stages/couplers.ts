/**
 * Couplers: ideal transformer, coupled coils, tapped coil (autotransformer) and a
 * capacitive tap.
 */
import type { Section, StageDefinition } from '../types';
import {
  capacitorYFn,
  capacitorZFn,
  enumParam,
  numParam,
  qParam,
  readParams,
  sectionFromFill,
  seriesSection,
  shuntSection,
  SpiceWriter,
  spiceNum,
} from './common';
import { fillCoupledInductors, idealTransformerAbcd, omega, zParamsToAbcd } from './primitives';

const TRANSFORMER_PARAMS = [
  numParam('n', 'Turns ratio (primary : secondary)', 'ratio', 2, {
    min: 0,
    exclusiveMin: true,
    tolerance: true,
    help: 'V1 = n·V2; an impedance on the secondary appears n² times larger at the primary.',
  }),
];

/** Ideal transformer, V1 = n·V2. */
export const IDEAL_TRANSFORMER: StageDefinition = {
  type: 'ideal-transformer',
  category: 'coupler',
  role: 'two-port',
  label: 'Ideal transformer',
  summary: 'A lossless turns ratio: scales voltage by n and impedance by n².',
  params: TRANSFORMER_PARAMS,
  build(values) {
    const n = readParams(TRANSFORMER_PARAMS, values).num('n');
    return {
      sections: [{ abcd: (_f, out, o) => idealTransformerAbcd(n, out, o) }],
      noise: { kind: 'passive' },
      spice(inNode, outNode, prefix) {
        // V(in) = n·V(out) from E; the sensed primary current I1 drives n·I1 into port 2.
        const w = new SpiceWriter(prefix);
        const mid = w.node();
        const sense = w.name('V');
        w.raw(`${sense} ${inNode} ${mid} 0`);
        w.raw(`${w.name('E')} ${mid} 0 ${outNode} 0 ${spiceNum(n)}`);
        w.raw(`${w.name('F')} 0 ${outNode} ${sense} ${spiceNum(n)}`);
        return w.lines;
      },
    };
  },
};

const COUPLED_PARAMS = [
  numParam('l1', 'Primary inductance', 'henry', 1e-6, {
    min: 0,
    exclusiveMin: true,
    tolerance: true,
  }),
  numParam('l2', 'Secondary inductance', 'henry', 10e-6, {
    min: 0,
    exclusiveMin: true,
    tolerance: true,
  }),
  numParam('k', 'Coupling coefficient', 'ratio', 0.5, {
    min: 0,
    exclusiveMin: true,
    max: 1,
    tolerance: true,
    help: 'M = k·√(L1·L2); 1 is perfect coupling.',
  }),
  qParam('q1', 'Primary Q', 100),
  qParam('q2', 'Secondary Q', 100),
];

/** Two magnetically coupled coils with winding losses. */
export const COUPLED_COILS: StageDefinition = {
  type: 'coupled-coils',
  category: 'coupler',
  role: 'two-port',
  label: 'Coupled coils',
  summary: 'Primary and secondary windings with mutual inductance and their own losses.',
  params: COUPLED_PARAMS,
  build(values) {
    const p = readParams(COUPLED_PARAMS, values);
    const [l1, l2, k, q1, q2] = ['l1', 'l2', 'k', 'q1', 'q2'].map((key) => p.num(key));
    return {
      sections: [
        sectionFromFill((f, fo, n, out, oo) =>
          fillCoupledInductors(l1, l2, k, q1, q2, f, fo, n, out, oo),
        ),
      ],
      noise: { kind: 'passive' },
      spice(inNode, outNode, prefix) {
        const w = new SpiceWriter(prefix);
        const a = w.inductor(inNode, '0', l1, q1);
        const b = w.inductor(outNode, '0', l2, q2);
        w.couple(a, b, k);
        return w.lines;
      },
    };
  },
};

const TAPPED_PARAMS = [
  numParam('l', 'Total inductance', 'henry', 10e-6, {
    min: 0,
    exclusiveMin: true,
    tolerance: true,
  }),
  numParam('tap', 'Tap position (fraction of turns from ground)', 'ratio', 0.2, {
    min: 0.01,
    max: 0.99,
    help: 'With tight coupling the voltage at the tap is this fraction of the voltage at the top.',
  }),
  numParam('k', 'Coupling between the two parts', 'ratio', 0.9, {
    min: 0,
    exclusiveMin: true,
    max: 1,
  }),
  qParam('q', 'Coil Q', 100),
  enumParam('direction', 'Direction', [
    ['step-down', 'In at the top, out at the tap'],
    ['step-up', 'In at the tap, out at the top'],
  ]),
];

/**
 * Tapped coil as an autotransformer. With total L, tap fraction t (of the turns, from the
 * ground end) and coupling k between the parts: Lbottom = a·t², Ltop = a·(1−t)²,
 * M = k·a·t·(1−t), with a chosen so Ltop + Lbottom + 2M = L. The coil's series loss ωL/Q
 * is shared in proportion to the turns. Z-parameters (port 1 = top, port 2 = tap):
 * z11 = Zt + Zb + 2Zm, z12 = z21 = Zb + Zm, z22 = Zb.
 */
export function tappedCoilParts(l: number, t: number, k: number, q: number) {
  const a = l / (t * t + (1 - t) * (1 - t) + 2 * k * t * (1 - t));
  const lTop = a * (1 - t) ** 2;
  const lBottom = a * t * t;
  return {
    lTop,
    lBottom,
    m: k * a * t * (1 - t),
    // Per-part Q so that Rtop = ωL(1−t)/Q and Rbottom = ωL·t/Q.
    qTop: (q * lTop) / (l * (1 - t)),
    qBottom: (q * lBottom) / (l * t),
  };
}

/** Tapped coil (autotransformer). */
export const TAPPED_COIL: StageDefinition = {
  type: 'tapped-coil',
  category: 'coupler',
  role: 'two-port',
  label: 'Tapped coil',
  summary:
    'One coil with a tap: an autotransformer stepping impedance by about the tap ratio squared.',
  params: TAPPED_PARAMS,
  build(values) {
    const p = readParams(TAPPED_PARAMS, values);
    const parts = tappedCoilParts(p.num('l'), p.num('tap'), p.num('k'), p.num('q'));
    const stepUp = p.str('direction') === 'step-up';
    const section: Section = {
      abcd(f, out, o) {
        const w = omega(f);
        const xt = w * parts.lTop;
        const xb = w * parts.lBottom;
        const xm = w * parts.m;
        const rt = xt / parts.qTop;
        const rb = xb / parts.qBottom;
        const zTopR = rt + rb;
        const zTopI = xt + xb + 2 * xm;
        const zTapR = rb;
        const zTapI = xb;
        const zmR = rb;
        const zmI = xb + xm;
        if (stepUp) zParamsToAbcd(zTapR, zTapI, zmR, zmI, zmR, zmI, zTopR, zTopI, out, o);
        else zParamsToAbcd(zTopR, zTopI, zmR, zmI, zmR, zmI, zTapR, zTapI, out, o);
      },
    };
    return {
      sections: [section],
      noise: { kind: 'passive' },
      spice(inNode, outNode, prefix) {
        const w = new SpiceWriter(prefix);
        const [top, tap] = stepUp ? [outNode, inNode] : [inNode, outNode];
        const a = w.inductor(top, tap, parts.lTop, parts.qTop);
        const b = w.inductor(tap, '0', parts.lBottom, parts.qBottom);
        w.couple(a, b, p.num('k'));
        return w.lines;
      },
    };
  },
};

const CAP_TAP_PARAMS = [
  numParam('c1', 'Top capacitor C1', 'farad', 100e-12, {
    min: 0,
    exclusiveMin: true,
    tolerance: true,
  }),
  numParam('c2', 'Bottom capacitor C2 (tap to ground)', 'farad', 900e-12, {
    min: 0,
    exclusiveMin: true,
    tolerance: true,
  }),
  qParam('qc', 'Capacitor Q', 1000),
  enumParam('direction', 'Direction', [
    ['step-down', 'In at the top, out at the tap'],
    ['step-up', 'In at the tap, out at the top'],
  ]),
];

/** Capacitive divider: C1 from the top to the tap, C2 from the tap to ground. */
export const CAPACITIVE_TAP: StageDefinition = {
  type: 'capacitive-tap',
  category: 'coupler',
  role: 'two-port',
  label: 'Capacitive tap',
  summary: 'Two capacitors as a divider: the tap sees about (C1/(C1+C2))² of the top impedance.',
  params: CAP_TAP_PARAMS,
  build(values) {
    const p = readParams(CAP_TAP_PARAMS, values);
    const [c1, c2, qc] = [p.num('c1'), p.num('c2'), p.num('qc')];
    const stepUp = p.str('direction') === 'step-up';
    const top = seriesSection(capacitorZFn(c1, qc));
    const bottom = shuntSection(capacitorYFn(c2, qc));
    return {
      sections: stepUp ? [bottom, top] : [top, bottom],
      noise: { kind: 'passive' },
      spice(inNode, outNode, prefix) {
        const w = new SpiceWriter(prefix);
        const tap = stepUp ? inNode : outNode;
        w.capacitor(inNode, outNode, c1, qc);
        w.capacitor(tap, '0', c2, qc);
        return w.lines;
      },
    };
  },
};
