/**
 * Minimal stage definitions for the core engine's tests, built from ABCD by hand:
 * series Z = [[1, Z], [0, 1]], shunt Y = [[1, 0], [Y, 1]], unilateral from Y-parameters.
 * Test-only: the product's catalogue lives in shared/engine/stages.
 */
import { StageParameterError } from '../../shared/engine/errors';
import type {
  ComplexFn,
  ParamSpec,
  ParamValues,
  Section,
  StageDefinition,
  StageModel,
} from '../../shared/engine/types';
import type { ChainDocument, ChainDocumentInput } from '../../shared/schema/chain';
import { parseChainDocument } from '../../shared/schema/parse-chain';

const TWO_PI = 2 * Math.PI; // read once: global lookups are slow inside the test VM
const w = (f: number) => TWO_PI * f;
const n = (v: ParamValues, k: string) => v[k] as number;

const num = (key: string, def: number, extra: Partial<ParamSpec> = {}): ParamSpec => ({
  key,
  label: key,
  kind: 'number',
  unit: 'ohm',
  default: def,
  ...extra,
});

/** Writes an ABCD matrix into 8 slots without allocating (the engine's hot path calls this). */
// prettier-ignore
function write(out: Float64Array, o: number, ar: number, ai: number, br: number, bi: number, cr: number, ci: number, dr: number, di: number): void {
  out[o] = ar; out[o + 1] = ai; out[o + 2] = br; out[o + 3] = bi;
  out[o + 4] = cr; out[o + 5] = ci; out[o + 6] = dr; out[o + 7] = di;
}

/** Series impedance section. */
export function seriesZ(z: ComplexFn): Section {
  const t = new Float64Array(2);
  return {
    abcd(f, out, o) {
      z(f, t, 0);
      write(out, o, 1, 0, t[0], t[1], 0, 0, 1, 0);
    },
  };
}

/** Shunt admittance section. */
export function shuntY(y: ComplexFn): Section {
  const t = new Float64Array(2);
  return {
    abcd(f, out, o) {
      y(f, t, 0);
      write(out, o, 1, 0, 0, 0, t[0], t[1], 1, 0);
    },
  };
}

/** Unilateral section from y11, y22 (real) and gm: y21 = −gm, y12 = 0. */
export function unilateral(
  g11: number,
  g22: number,
  gm: number,
  translate?: (f: number) => number,
): Section {
  // A = −y22/y21, B = −1/y21, C = −y11·y22/y21, D = −y11/y21 with y21 = −gm
  return {
    unilateral: true,
    translate,
    abcd(_f, out, o) {
      write(out, o, g22 / gm, 0, 1 / gm, 0, (g11 * g22) / gm, 0, g11 / gm, 0);
    },
  };
}

/** Source: EMF `emf` (PEAK V) behind rs + j·xs. */
export const T_SOURCE: StageDefinition = {
  type: 't-source',
  category: 'source',
  role: 'source',
  label: 'Test source',
  summary: 'EMF behind a fixed impedance.',
  params: [
    num('rs', 50, { min: 0, exclusiveMin: true, label: 'Source resistance' }),
    num('xs', 0, { label: 'Source reactance' }),
    num('emf', 1, { unit: 'volt', min: 0, label: 'EMF' }),
  ],
  build: (v) => ({
    emf: () => n(v, 'emf'),
    impedance: (_f, out, o) => {
      out[o] = n(v, 'rs');
      out[o + 1] = n(v, 'xs');
    },
  }),
};

/** Load: a resistance, an open or a short. */
export const T_LOAD: StageDefinition = {
  type: 't-load',
  category: 'load',
  role: 'load',
  label: 'Test load',
  summary: 'Resistive, open or shorted termination.',
  params: [
    {
      key: 'mode',
      label: 'Termination',
      kind: 'enum',
      unit: 'none',
      default: 'r',
      options: [
        { value: 'r', label: 'resistor' },
        { value: 'open', label: 'open' },
        { value: 'short', label: 'short' },
      ],
    },
    num('r', 50, { min: 0, exclusiveMin: true, label: 'Load resistance', showWhen: { key: 'mode', equals: 'r' } }), // prettier-ignore
  ],
  build: (v) => ({
    impedance: (_f, out, o) => {
      out[o] = v['mode'] === 'open' ? Infinity : v['mode'] === 'short' ? 0 : n(v, 'r');
      out[o + 1] = 0;
    },
  }),
};

/** Series R + jωL + 1/(jωC) (c = 0: no capacitor). */
export const T_SERIES: StageDefinition = {
  type: 't-series',
  category: 'element',
  role: 'two-port',
  label: 'Series RLC',
  summary: 'Series resistor, inductor and capacitor.',
  params: [
    num('r', 0, { min: 0, label: 'Resistance' }),
    num('l', 0, { unit: 'henry', min: 0, label: 'Inductance' }),
    num('c', 0, { unit: 'farad', min: 0, label: 'Capacitance' }),
    { key: 'resonator', label: 'Declare resonator', kind: 'boolean', unit: 'none', default: false },
  ],
  build: (v) => {
    const z: ComplexFn = (f, out, o) => {
      out[o] = n(v, 'r');
      out[o + 1] = w(f) * n(v, 'l') - (n(v, 'c') > 0 ? 1 / (w(f) * n(v, 'c')) : 0);
    };
    const model: StageModel = { sections: [seriesZ(z)], noise: { kind: 'passive' } };
    if (v['resonator']) model.resonators = [{ kind: 'series', label: 'Ls/Cs', section: 0, ownImpedance: z }]; // prettier-ignore
    return model;
  },
};

/** Shunt tank: L with series loss rs, C, optional parallel rp (0 = none); declares its tank. */
export const T_TANK: StageDefinition = {
  type: 't-tank',
  category: 'filter',
  role: 'two-port',
  label: 'Tank',
  summary: 'Parallel L–C tank to ground.',
  params: [
    num('l', 10e-6, { unit: 'henry', min: 0, exclusiveMin: true, label: 'Inductance' }),
    num('c', 100e-12, { unit: 'farad', min: 0, exclusiveMin: true, label: 'Capacitance' }),
    num('rs', 0, { min: 0, label: 'Coil series loss' }),
    num('rp', 0, { min: 0, label: 'Parallel resistance' }),
  ],
  build: (v) => {
    const y: ComplexFn = (f, out, o) => {
      const rs = n(v, 'rs');
      const xl = w(f) * n(v, 'l');
      const d = rs * rs + xl * xl;
      out[o] = rs / d + (n(v, 'rp') > 0 ? 1 / n(v, 'rp') : 0);
      out[o + 1] = w(f) * n(v, 'c') - xl / d;
    };
    return {
      sections: [shuntY(y)],
      resonators: [{ kind: 'shunt', label: 'L1/C1', node: 1, ownAdmittance: y }],
      noise: { kind: 'passive' },
    };
  },
};

/** Shunt resistor (e.g. a detector's input resistance) with an optional detector threshold. */
export const T_SHUNT_R: StageDefinition = {
  type: 't-shunt-r',
  category: 'load',
  role: 'two-port',
  label: 'Shunt resistor',
  summary: 'Resistor to ground.',
  params: [
    num('r', 1000, { min: 0, exclusiveMin: true, label: 'Load resistance' }),
    num('vmin', 0, { unit: 'volt', min: 0, label: 'Working level' }),
  ],
  build: (v) => ({
    sections: [shuntY((_f, out, o) => ((out[o] = 1 / n(v, 'r')), (out[o + 1] = 0)))],
    ...(n(v, 'vmin') > 0 ? { detector: { minInputPeakV: n(v, 'vmin') } } : {}),
  }),
};

/** Unilateral amplifier from rin, rout and gm with a noise figure and linearity. */
export const T_AMP: StageDefinition = {
  type: 't-amp',
  category: 'amplifier',
  role: 'two-port',
  label: 'Amplifier',
  summary: 'Unilateral transconductance stage.',
  params: [
    num('rin', 50, { min: 0, exclusiveMin: true, label: 'Input resistance' }),
    num('rout', 50, { min: 0, exclusiveMin: true, label: 'Output resistance' }),
    num('gm', 0.1, { unit: 'siemens', min: 0, exclusiveMin: true, label: 'Transconductance' }),
    num('nf', 3, { unit: 'db', min: 0, label: 'Noise figure' }),
    num('iip3', 10, { unit: 'dbm', label: 'IIP3' }),
    num('p1db', 0, { unit: 'dbm', label: 'P1dB' }),
  ],
  build: (v) => ({
    sections: [unilateral(1 / n(v, 'rin'), 1 / n(v, 'rout'), n(v, 'gm'))],
    noise: { kind: 'figure', nfDb: n(v, 'nf') },
    linearity: { iip3Dbm: n(v, 'iip3'), p1dbDbm: n(v, 'p1db') },
  }),
};

/**
 * One section that is series (r + jx), then shunt (g + jb), then an ideal n:1 transformer,
 * multiplied into a single ABCD so that no entry is trivially 0 or 1.
 */
export const T_GENERAL: StageDefinition = {
  type: 't-general',
  category: 'element',
  role: 'two-port',
  label: 'General section',
  summary: 'A passive section with a full ABCD matrix.',
  params: [
    num('r', 10, { min: 0, label: 'Series resistance' }),
    num('x', 30, { label: 'Series reactance' }),
    num('g', 0.002, { unit: 'siemens', min: 0, label: 'Shunt conductance' }),
    num('b', 0.01, { unit: 'siemens', label: 'Shunt susceptance' }),
    num('n', 2, { unit: 'ratio', min: 0, exclusiveMin: true, label: 'Turns ratio' }),
  ],
  build: (v) => {
    const [r, x, g, b, t] = ['r', 'x', 'g', 'b', 'n'].map((k) => n(v, k));
    // [[1, Z], [0, 1]]·[[1, 0], [Y, 1]] = [[1 + ZY, Z], [Y, 1]], then ·[[t, 0], [0, 1/t]]
    const zyR = r * g - x * b;
    const zyI = r * b + x * g;
    return {
      sections: [
        { abcd: (_f, out, o) => write(out, o, (1 + zyR) * t, zyI * t, r / t, x / t, g * t, b * t, 1 / t, 0) }, // prettier-ignore
      ],
      noise: { kind: 'passive' },
    };
  },
};

/** Unilateral amplifier described by noise parameters (Fmin, Rn, Yopt). */
export const T_FET: StageDefinition = {
  type: 't-fet',
  category: 'amplifier',
  role: 'two-port',
  label: 'Low-noise amplifier',
  summary: 'Unilateral stage with noise parameters.',
  params: [
    num('rin', 200, { min: 0, exclusiveMin: true, label: 'Input resistance' }),
    num('fmin', 0.8, { unit: 'db', min: 0, label: 'Fmin' }),
    num('rn', 15, { min: 0, label: 'Rn' }),
    num('yopt', 0.015, { unit: 'siemens', label: 'Yopt real part' }),
    num('boptim', -0.005, { unit: 'siemens', label: 'Yopt imaginary part' }),
  ],
  build: (v) => ({
    sections: [unilateral(1 / n(v, 'rin'), 1 / 300, 0.05)],
    noise: { kind: 'parameters', fminDb: n(v, 'fmin'), rn: n(v, 'rn'), yoptRe: n(v, 'yopt'), yoptIm: n(v, 'boptim') }, // prettier-ignore
  }),
};

/** Difference mixer: unilateral, output |f − fLO|; `declare` states the LO in the model. */
export const T_MIXER: StageDefinition = {
  type: 't-mixer',
  category: 'mixer',
  role: 'two-port',
  label: 'Mixer',
  summary: 'Ideal difference mixer.',
  params: [
    num('lo', 1.455e6, { unit: 'hertz', min: 0, exclusiveMin: true, label: 'LO frequency' }),
    num('rin', 0, { min: 0, label: 'Input resistance (0 = open)' }),
    num('rout', 1000, { min: 0, exclusiveMin: true, label: 'Output resistance' }),
    { key: 'declare', label: 'Declare LO', kind: 'boolean', unit: 'none', default: false },
  ],
  build: (v, ctx) => {
    const lo = n(v, 'lo');
    if (Math.abs(lo - ctx.f0Hz) < 1) throw new StageParameterError('lo', 'LO frequency must differ from the signal frequency'); // prettier-ignore
    const rin = n(v, 'rin');
    return {
      sections: [
        unilateral(rin > 0 ? 1 / rin : 0, 1 / n(v, 'rout'), 0.01, (f) => Math.abs(f - lo)),
      ],
      ...(v['declare'] ? { mixer: { loHz: lo, product: 'difference' as const } } : {}),
    };
  },
};

/** A matching stage that states what it was designed for, and its Q budget. */
export const T_MATCH: StageDefinition = {
  type: 't-match',
  category: 'matching',
  role: 'two-port',
  label: 'Match',
  summary: 'Series resistor pretending to be a designed match.',
  params: [
    num('r', 0, { min: 0, label: 'Series resistance' }),
    num('qreq', 1, { unit: 'ratio', min: 0, label: 'Required Q' }),
    num('qpart', 100, { unit: 'ratio', min: 0, label: 'Part Q' }),
  ],
  cautions: ['high-voltage'],
  build: (v) => ({
    sections: [seriesZ((_f, out, o) => ((out[o] = n(v, 'r')), (out[o + 1] = 0)))],
    designedMatch: { r1: 50, r2: 50 },
    qBudget: { required: n(v, 'qreq'), componentQ: n(v, 'qpart') },
  }),
};

/** A detector or converter input as the chain's load: resistance, working level, noise figure. */
export const T_DETECTOR_LOAD: StageDefinition = {
  type: 't-detector-load',
  category: 'load',
  role: 'load',
  label: 'Detector load',
  summary: 'Resistive load that needs a minimum drive.',
  params: [
    num('r', 50, { min: 0, exclusiveMin: true, label: 'Input resistance' }),
    num('vmin', 0.1, { unit: 'volt', min: 0, label: 'Working level' }),
    num('nf', 0, { unit: 'db', min: 0, label: 'Noise figure (0 = none)' }),
  ],
  build: (v) => ({
    impedance: (_f, out, o) => ((out[o] = n(v, 'r')), (out[o + 1] = 0)),
    detector: { minInputPeakV: n(v, 'vmin') },
    ...(n(v, 'nf') > 0 ? { noise: { kind: 'figure' as const, nfDb: n(v, 'nf') } } : {}),
  }),
};

/** A load that reads a one-point measured table, from a text value or an attached file. */
export const T_MEASURED_LOAD: StageDefinition = {
  type: 't-measured-load',
  category: 'load',
  role: 'load',
  label: 'Measured load',
  summary: 'Resistance read from a table.',
  params: [{ key: 'table', label: 'Table', kind: 'text', unit: 'none', default: '50' }],
  build: (v, ctx) => {
    // S11 against z0 gives Z = z0·(1 + S11)/(1 − S11) for a real S11
    const p = ctx.dataFile?.points[0];
    const r = p ? (p.z0 * (1 + p.s11.re)) / (1 - p.s11.re) : Number(v['table']);
    return { impedance: (_f, out, o) => ((out[o] = r), (out[o + 1] = 0)) };
  },
};

export const TEST_CATALOGUE: StageDefinition[] = [
  T_GENERAL,
  T_FET,
  T_MEASURED_LOAD,
  T_DETECTOR_LOAD,
  T_SOURCE,
  T_LOAD,
  T_SERIES,
  T_TANK,
  T_SHUNT_R,
  T_AMP,
  T_MIXER,
  T_MATCH,
];

export interface StageInput {
  type: string;
  values?: ParamValues;
  label?: string;
}

/** A chain document over the test catalogue, parsed as the engine takes it. */
export function chain(
  stages: StageInput[],
  settings: Partial<ChainDocumentInput['settings']> & { f0Hz: number },
): ChainDocument {
  return parseChainDocument({
    name: 'test chain',
    settings: {
      sweep: { startHz: settings.f0Hz / 2, stopHz: settings.f0Hz * 2, points: 2001, scale: 'lin' },
      ...settings,
    },
    stages: stages.map((s, i) => ({ id: `s${i}`, label: s.label ?? '', type: s.type, values: s.values ?? {} })), // prettier-ignore
  });
}
