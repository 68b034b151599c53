/**
 * Amplifiers as unilateral two-ports: input R ∥ C, output R ∥ C and a transconductance
 * (or a stated gain), with a noise figure or noise parameters, IIP3 and P1dB.
 */
import type { NoiseDecl, ParamSpec, ParamValues, StageDefinition, TwoPortModel } from '../types';
import { enumParam, numParam, readParams, SpiceWriter, spiceNum } from './common';
import { gmForStatedGain, unilateralSection } from './active-common';

const byGain = { key: 'gainMode', equals: 'stated' };
const byGm = { key: 'gainMode', equals: 'gm' };
const byFigure = { key: 'noiseMode', equals: 'figure' };
const byStatedSource = { key: 'nfSource', equals: 'stated' };
const byParams = { key: 'noiseMode', equals: 'parameters' };
const positive = { min: 0, exclusiveMin: true, tolerance: true };

function amplifierParams(d: {
  rin: number;
  cin: number;
  rout: number;
  cout: number;
  gm: number;
  nf: number;
}): ParamSpec[] {
  return [
    numParam('rin', 'Input resistance', 'ohm', d.rin, positive),
    numParam('cin', 'Input capacitance', 'farad', d.cin, { min: 0, tolerance: true }),
    numParam('rout', 'Output resistance', 'ohm', d.rout, {
      ...positive,
      help: 'Device output resistance in parallel with its own load resistor, if any.',
    }),
    numParam('cout', 'Output capacitance', 'farad', d.cout, { min: 0, tolerance: true }),
    enumParam('gainMode', 'Gain given as', [
      ['gm', 'Transconductance'],
      ['stated', 'Stated power gain'],
    ]),
    numParam('gm', 'Transconductance', 'siemens', d.gm, { ...positive, showWhen: byGm }),
    enumParam(
      'polarity',
      'Phase',
      [
        ['inverting', 'Inverting (common emitter, source or cathode)'],
        ['non-inverting', 'Non-inverting (common base or gate)'],
      ],
      {
        showWhen: byGm,
        help: 'A stated-gain block does not invert. The SPICE export follows the same choice.',
      },
    ),
    numParam('gainDb', 'Stated power gain', 'db', 20, {
      min: -40,
      max: 80,
      showWhen: byGain,
      help: 'Available power gain from a source equal to the input resistance (= gain into a load equal to the output resistance).',
    }),
    enumParam('noiseMode', 'Noise given as', [
      ['figure', 'Noise figure'],
      ['parameters', 'Noise parameters'],
    ]),
    numParam('nfDb', 'Noise figure', 'db', d.nf, { min: 0, max: 40, showWhen: byFigure }),
    enumParam(
      'nfSource',
      'Noise figure stated at',
      [
        ['input', 'A source matched to the input'],
        ['stated', 'A stated source resistance'],
      ],
      {
        showWhen: byFigure,
        help: 'A noise figure holds only at the source it was stated for; driven from another source the stage is flagged.',
      },
    ),
    numParam('nfSourceR', 'Rated source resistance', 'ohm', 50, {
      min: 0,
      exclusiveMin: true,
      max: 1e9,
      typical: { min: 1, max: 1e7 },
      showWhen: byStatedSource,
    }),
    numParam('fminDb', 'Minimum noise figure', 'db', d.nf, { min: 0, max: 40, showWhen: byParams }),
    numParam('rn', 'Noise resistance Rn', 'ohm', 20, { min: 0, showWhen: byParams }),
    numParam('ropt', 'Optimum source resistance', 'ohm', 50, {
      min: 0,
      exclusiveMin: true,
      showWhen: byParams,
    }),
    numParam('xopt', 'Optimum source reactance', 'ohm', 0, { showWhen: byParams }),
    numParam('iip3Dbm', 'Input third-order intercept (IIP3)', 'dbm', 0, { min: -60, max: 80 }),
    numParam('p1dbDbm', 'Input 1 dB compression point', 'dbm', -10, { min: -80, max: 80 }),
  ];
}

/**
 * The noise declaration. A figure stated "at a source equal to the input" holds for the
 * source that matches the input (the conjugate of Rin ∥ Cin at the design frequency).
 */
function noiseOf(
  p: ReturnType<typeof readParams>,
  rin: number,
  cin: number,
  f0: number,
): NoiseDecl {
  if (p.str('noiseMode') === 'figure') {
    if (p.str('nfSource') === 'stated') {
      return { kind: 'figure', nfDb: p.num('nfDb'), ratedSourceOhm: p.num('nfSourceR') };
    }
    const g = 1 / rin;
    const b = 2 * Math.PI * f0 * cin;
    const d = g * g + b * b;
    return { kind: 'figure', nfDb: p.num('nfDb'), ratedSourceOhm: g / d, ratedSourceX: b / d };
  }
  const r = p.num('ropt');
  const x = p.num('xopt');
  const d = r * r + x * x;
  return {
    kind: 'parameters',
    fminDb: p.num('fminDb'),
    rn: p.num('rn'),
    yoptRe: r / d,
    yoptIm: -x / d,
  };
}

function buildAmplifier(params: ParamSpec[], values: ParamValues, f0: number): TwoPortModel {
  const p = readParams(params, values);
  const [rin, cin, rout, cout] = ['rin', 'cin', 'rout', 'cout'].map((k) => p.num(k));
  const byGmMode = p.str('gainMode') === 'gm';
  const gm = byGmMode ? p.num('gm') : gmForStatedGain(p.num('gainDb'), rin, rout);
  const inverting = byGmMode && p.str('polarity') === 'inverting';
  return {
    sections: [unilateralSection({ rin, cin, rout, cout, gm, inverting })],
    noise: noiseOf(p, rin, cin, f0),
    linearity: { iip3Dbm: p.num('iip3Dbm'), p1dbDbm: p.num('p1dbDbm') },
    spice(inNode, outNode, prefix) {
      const w = new SpiceWriter(prefix);
      w.resistor(inNode, '0', rin);
      if (cin > 0) w.capacitor(inNode, '0', cin);
      // A G source `G n+ n- c+ c- gm` drives gm·V(c) from n+ through itself to n-.
      // Inverting (y21 = −gm): current gm·V(in) flows out of the output node into the
      // device, so G runs from outNode to ground. Non-inverting (y21 = +gm): reversed.
      const [from, to] = inverting ? [outNode, '0'] : ['0', outNode];
      w.raw(`${w.name('G')} ${from} ${to} ${inNode} 0 ${spiceNum(gm)}`);
      w.resistor(outNode, '0', rout);
      if (cout > 0) w.capacitor(outNode, '0', cout);
      return w.lines;
    },
  };
}

/** Preset values: typical small-signal figures of the trade (common practice, from memory). */
function preset(
  key: string,
  label: string,
  v: Record<string, number>,
  polarity: 'inverting' | 'non-inverting' = 'inverting',
) {
  return { key, label, values: { gainMode: 'gm', noiseMode: 'figure', polarity, ...v } };
}

const AMP_PARAMS = amplifierParams({
  rin: 2600,
  cin: 25e-12,
  rout: 5000,
  cout: 4e-12,
  gm: 0.0385,
  nf: 2.5,
});

/** General unilateral amplifier with presets for the common transistor configurations. */
export const UNILATERAL_AMPLIFIER: StageDefinition = {
  type: 'unilateral-amplifier',
  category: 'amplifier',
  role: 'two-port',
  label: 'Amplifier',
  summary: 'A one-way gain stage: input R ∥ C, output R ∥ C and a transconductance.',
  params: AMP_PARAMS,
  presets: [
    preset('common-emitter', 'Common emitter (bipolar, about 1 mA; typical)', {
      rin: 2600,
      cin: 25e-12,
      rout: 5000,
      cout: 4e-12,
      gm: 0.0385,
      nfDb: 2.5,
      iip3Dbm: -10,
      p1dbDbm: -20,
    }),
    preset('common-source', 'Common source (junction FET; typical)', {
      rin: 100e3,
      cin: 5e-12,
      rout: 2000,
      cout: 3e-12,
      gm: 0.012,
      nfDb: 1.5,
      iip3Dbm: 10,
      p1dbDbm: 0,
    }),
    preset(
      'common-base',
      'Common base (bipolar, about 1 mA; typical)',
      {
        rin: 26,
        cin: 10e-12,
        rout: 10e3,
        cout: 3e-12,
        gm: 0.0385,
        nfDb: 3,
        iip3Dbm: 5,
        p1dbDbm: -5,
      },
      'non-inverting',
    ),
    preset(
      'common-gate',
      'Common gate (junction FET; typical)',
      {
        rin: 83,
        cin: 5e-12,
        rout: 2000,
        cout: 2e-12,
        gm: 0.012,
        nfDb: 3.5,
        iip3Dbm: 15,
        p1dbDbm: 5,
      },
      'non-inverting',
    ),
    preset('cascode', 'Cascode (bipolar pair; typical)', {
      rin: 2600,
      cin: 8e-12,
      rout: 20e3,
      cout: 2e-12,
      gm: 0.0385,
      nfDb: 2.5,
      iip3Dbm: -5,
      p1dbDbm: -15,
    }),
  ],
  build: (values, ctx) => buildAmplifier(AMP_PARAMS, values, ctx.f0Hz),
};

const TRIODE_PARAMS = amplifierParams({
  rin: 1e6,
  cin: 3e-12,
  rout: 10e3,
  cout: 2e-12,
  gm: 0.005,
  nf: 4,
});

/**
 * Vacuum triode, grounded cathode: grid-leak input, plate resistance output. Typical
 * small-signal figures (gm a few mA/V, rp about 10 kΩ; from memory).
 */
export const TRIODE_AMPLIFIER: StageDefinition = {
  type: 'triode-amplifier',
  category: 'amplifier',
  role: 'two-port',
  label: 'Triode stage',
  summary: 'A vacuum-tube triode gain stage. Its plate supply is at a dangerous voltage.',
  params: TRIODE_PARAMS,
  cautions: ['high-voltage'],
  presets: [
    preset('vacuum-triode', 'Small-signal triode, grounded cathode (typical)', {
      rin: 1e6,
      cin: 3e-12,
      rout: 10e3,
      cout: 2e-12,
      gm: 0.005,
      nfDb: 4,
      iip3Dbm: 10,
      p1dbDbm: 0,
    }),
  ],
  build: (values, ctx) => buildAmplifier(TRIODE_PARAMS, values, ctx.f0Hz),
};
