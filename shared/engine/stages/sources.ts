/**
 * Sources: a resistive generator, a short monopole (whip or wire) antenna and a measured
 * antenna. Each gives its open-circuit EMF (PEAK volts) and its source impedance; none has
 * sections. In SPICE a source is `V${prefix}` behind its impedance, ending at `outNode`.
 */
import { StageParameterError } from '../errors';
import type { StageDefinition } from '../types';
import { enumParam, numParam, readParams, SpiceWriter, spiceNum } from './common';
import {
  impedanceTableFromNetwork,
  interpolate,
  parseTable,
  type SampleTable,
} from './measured-data';

const SPEED_OF_LIGHT = 299_792_458;
/** 2π·ε0, F/m. */
const TWO_PI_EPSILON0 = 2 * Math.PI * 8.8541878128e-12;

function emitSource(
  prefix: string,
  emfPeak: number,
  tail: (w: SpiceWriter, from: string) => void,
): string[] {
  const w = new SpiceWriter(prefix);
  const e = w.node();
  w.raw(`V${prefix} ${e} 0 DC 0 AC ${spiceNum(emfPeak)}`);
  tail(w, e);
  return w.lines;
}

const GENERATOR_PARAMS = [
  numParam('r', 'Source resistance', 'ohm', 50, { min: 0, exclusiveMin: true }),
  enumParam('level', 'Level given as', [
    ['power', 'Available power'],
    ['emf', 'Open-circuit EMF'],
  ]),
  numParam('powerDbm', 'Available power', 'dbm', -100, {
    min: -250,
    max: 60,
    showWhen: { key: 'level', equals: 'power' },
  }),
  numParam('emf', 'Open-circuit EMF (peak)', 'volt', 1e-6, {
    // Gains are ratios of signal levels: a chain needs some signal to have any.
    min: 0,
    exclusiveMin: true,
    typical: { min: 1e-12, max: 1e3 },
    showWhen: { key: 'level', equals: 'emf' },
  }),
];

/** Signal generator: an EMF behind a resistance. */
export const RESISTIVE_GENERATOR: StageDefinition = {
  type: 'resistive-generator',
  category: 'source',
  role: 'source',
  label: 'Resistive generator',
  summary: 'A signal source behind a plain resistance, set by its EMF or its available power.',
  params: GENERATOR_PARAMS,
  build(values) {
    const p = readParams(GENERATOR_PARAMS, values);
    const r = p.num('r');
    // Available power P = Es²/(8R) with Es the peak EMF.
    const emf =
      p.str('level') === 'emf'
        ? p.num('emf')
        : Math.sqrt(8 * r * 1e-3 * 10 ** (p.num('powerDbm') / 10));
    return {
      emf: () => emf,
      impedance: (_f, out, o) => {
        out[o] = r;
        out[o + 1] = 0;
      },
      spice: (_in, outNode, prefix) => emitSource(prefix, emf, (w, e) => w.resistor(e, outNode, r)),
    };
  },
};

const MONOPOLE_PARAMS = [
  numParam('height', 'Height', 'metre', 1, {
    min: 0,
    exclusiveMin: true,
    help: 'The short-antenna formulas hold while the height is under λ/20: 15 m at 1 MHz, 1.5 m at 10 MHz, 0.5 m at 30 MHz.',
  }),
  numParam('diameter', 'Wire diameter', 'metre', 2e-3, { min: 0, exclusiveMin: true }),
  numParam('lossR', 'Loss resistance', 'ohm', 5, {
    min: 0,
    help: 'Ground and conductor losses in series with the radiation resistance.',
  }),
  numParam('fieldRms', 'Field strength (rms)', 'volt-per-metre', 10e-6, {
    min: 0,
    exclusiveMin: true,
    typical: { min: 1e-12, max: 1e3 },
  }),
  enumParam(
    'current',
    'Current along the wire',
    [
      ['triangular', 'Triangular (plain whip): R = 40π²(h/λ)², effective height h/2'],
      ['uniform', 'Uniform (top-loaded): R = 160π²(h/λ)², effective height h'],
    ],
    {
      help: 'A top hat large enough to carry the current to the tip makes the current uniform: four times the radiation resistance, twice the effective height.',
    },
  ),
  numParam('topHatC', 'Top-hat capacitance', 'farad', 20e-12, {
    min: 0,
    typical: { max: 1e-9 },
    showWhen: { key: 'current', equals: 'uniform' },
    help: "Capacitance of the top hat to ground; it adds to the wire's own capacitance.",
  }),
];

/**
 * Radiation resistance factor and effective height of a short monopole for its current
 * distribution (over a perfect ground, h ≪ λ; C. A. Balanis, "Antenna Theory", short and
 * infinitesimal dipoles, halved for the monopole by image theory; from memory):
 * - triangular (plain whip): R = 40π²(h/λ)², effective height h/2;
 * - uniform (top-loaded): R = 160π²(h/λ)², effective height h.
 */
export function currentDistribution(kind: 'triangular' | 'uniform') {
  return kind === 'uniform'
    ? { rFactor: 160 * Math.PI ** 2, heightFactor: 1 }
    : { rFactor: 40 * Math.PI ** 2, heightFactor: 0.5 };
}

/**
 * Short monopole over a perfect ground, height h ≪ λ, wire diameter d:
 * - radiation resistance R = 40π²(h/λ)² (half the short dipole's 80π²(h'/λ)² with h' = 2h,
 *   triangular current; image principle);
 * - capacitance C = 2πε0·h / (ln(2h/d) − 1), the standard short-vertical formula
 *   (antenna handbooks give it as C = 17·h/(ln(24h/D) − 1) pF with h in feet and D in
 *   inches; both from memory), valid while h < λ/20;
 * - EMF = E·h/2 (effective height h/2 for the triangular current); E is given rms, the
 *   EMF is returned peak.
 */
export function shortMonopole(height: number, diameter: number) {
  if (!(2 * height > diameter * Math.E)) {
    throw new StageParameterError(
      'diameter',
      `the wire (${diameter} m) is too thick for a ${height} m monopole: the short-antenna ` +
        'capacitance formula needs a height well above the diameter',
    );
  }
  return {
    capacitance: (TWO_PI_EPSILON0 * height) / (Math.log((2 * height) / diameter) - 1),
    radiationResistance: (f: number) => 40 * Math.PI ** 2 * ((height * f) / SPEED_OF_LIGHT) ** 2,
    effectiveHeight: height / 2,
  };
}

/** Short vertical wire or whip antenna. */
export const SHORT_MONOPOLE: StageDefinition = {
  type: 'short-monopole',
  category: 'source',
  role: 'source',
  label: 'Short whip antenna',
  summary:
    'A vertical wire much shorter than a quarter wave, plain or top-loaded: small radiation resistance, a few pF.',
  params: MONOPOLE_PARAMS,
  build(values) {
    const p = readParams(MONOPOLE_PARAMS, values);
    const height = p.num('height');
    const ant = shortMonopole(height, p.num('diameter'));
    const uniform = p.str('current') === 'uniform';
    const dist = currentDistribution(uniform ? 'uniform' : 'triangular');
    const lossR = p.num('lossR');
    // A top hat adds its capacitance to ground to the wire's own.
    const c = ant.capacitance + (uniform ? p.num('topHatC') : 0);
    const emf = Math.SQRT2 * p.num('fieldRms') * dist.heightFactor * height;
    const rRad = (f: number) => dist.rFactor * ((height * f) / SPEED_OF_LIGHT) ** 2;
    return {
      emf: () => emf,
      impedance: (f, out, o) => {
        out[o] = rRad(f) + lossR;
        out[o + 1] = -1 / (2 * Math.PI * f * c);
      },
      spice: (_in, outNode, prefix) =>
        emitSource(prefix, emf, (w, e) => {
          const mid = w.node();
          w.capacitor(e, mid, c);
          const k = (dist.rFactor * height ** 2) / SPEED_OF_LIGHT ** 2;
          // With no loss resistance the operating point (hertz = 0) would see 0 Ω in series
          // with C and no DC path; the 1e-12 Ω floor keeps it regular and is below the
          // radiation resistance at any frequency of interest.
          const r =
            lossR > 0
              ? `${spiceNum(k)}*hertz*hertz+${spiceNum(lossR)}`
              : `max(${spiceNum(k)}*hertz*hertz,1e-12)`;
          w.raw(`${w.name('R')} ${mid} ${outNode} r={${r}}`);
        }),
    };
  },
};

const MEASURED_ANTENNA_PARAMS = [
  {
    key: 'table',
    label: 'Impedance points',
    kind: 'text' as const,
    unit: 'none' as const,
    default: '1e6 20 -900; 2e6 22 -450; 4e6 25 -220',
    help: 'Points "f R X; f R X" (Hz, Ω, Ω), used when no data file is attached; linear in f.',
  },
  numParam('fieldRms', 'Field strength (rms)', 'volt-per-metre', 10e-6, {
    min: 0,
    exclusiveMin: true,
    typical: { min: 1e-12, max: 1e3 },
  }),
  numParam('effectiveHeight', 'Effective height', 'metre', 0.5, { min: 0, exclusiveMin: true }),
];

/** Antenna from measured impedance points (one-port file or a short table). */
export const MEASURED_ANTENNA: StageDefinition = {
  type: 'measured-antenna',
  category: 'source',
  role: 'source',
  label: 'Measured antenna',
  summary: 'An antenna described by its measured impedance, interpolated between the points.',
  params: MEASURED_ANTENNA_PARAMS,
  build(values, ctx) {
    const p = readParams(MEASURED_ANTENNA_PARAMS, values);
    const table: SampleTable = ctx.dataFile
      ? impedanceTableFromNetwork(ctx.dataFile)
      : parseTable(p.str('table'), 2, 'table', 'f R X');
    const emf = Math.SQRT2 * p.num('fieldRms') * p.num('effectiveHeight');
    return {
      emf: () => emf,
      impedance: (f, out, o) => interpolate(table, f, out, o),
    };
  },
};
