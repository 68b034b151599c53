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

function noiseOf(p: ReturnType<typeof readParams>): NoiseDecl {
  if (p.str('noiseMode') === 'figure') return { kind: 'figure', nfDb: p.num('nfDb') };
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

function buildAmplifier(params: ParamSpec[], values: ParamValues): TwoPortModel {
  const p = readParams(params, values);
  const [rin, cin, rout, cout] = ['rin', 'cin', 'rout', 'cout'].map((k) => p.num(k));
  const gm = p.str('gainMode') === 'gm' ? p.num('gm') : gmForStatedGain(p.num('gainDb'), rin, rout);
  return {
    sections: [unilateralSection({ rin, cin, rout, cout, gm })],
    noise: noiseOf(p),
    linearity: { iip3Dbm: p.num('iip3Dbm'), p1dbDbm: p.num('p1dbDbm') },
    spice(inNode, outNode, prefix) {
      const w = new SpiceWriter(prefix);
      w.resistor(inNode, '0', rin);
      if (cin > 0) w.capacitor(inNode, '0', cin);
      // y21 = −gm: the source pushes gm·V(in) into the output node (inverting stage).
      w.raw(`${w.name('G')} 0 ${outNode} ${inNode} 0 ${spiceNum(gm)}`);
      w.resistor(outNode, '0', rout);
      if (cout > 0) w.capacitor(outNode, '0', cout);
      return w.lines;
    },
  };
}

/** Preset values: typical small-signal figures of the trade (common practice, from memory). */
function preset(key: string, label: string, v: Record<string, number>) {
  return { key, label, values: { gainMode: 'gm', noiseMode: 'figure', ...v } };
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
    preset('common-base', 'Common base (bipolar, about 1 mA; typical)', {
      rin: 26,
      cin: 10e-12,
      rout: 10e3,
      cout: 3e-12,
      gm: 0.0385,
      nfDb: 3,
      iip3Dbm: 5,
      p1dbDbm: -5,
    }),
    preset('common-gate', 'Common gate (junction FET; typical)', {
      rin: 83,
      cin: 5e-12,
      rout: 2000,
      cout: 2e-12,
      gm: 0.012,
      nfDb: 3.5,
      iip3Dbm: 15,
      p1dbDbm: 5,
    }),
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
  build: (values) => buildAmplifier(AMP_PARAMS, values),
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
  build: (values) => buildAmplifier(TRIODE_PARAMS, values),
};
