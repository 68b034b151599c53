/**
 * Detectors and loads: one-ports at the end of the chain. Each gives its impedance; none
 * has sections. In SPICE a load is elements from `inNode` to ground.
 */
import type { ComplexFn, ParamSpec, StageDefinition } from '../types';
import { enumParam, numParam, readParams, SpiceWriter } from './common';
import { detectorInputResistance } from './diode-detector';

/** R ∥ C as a ComplexFn. */
function rParallelC(r: number, c: number): ComplexFn {
  return (f, out, o) => {
    const b = 2 * Math.PI * f * c;
    // 1/(1/R + jωC)
    const g = 1 / r;
    const d = g * g + b * b;
    out[o] = g / d;
    out[o + 1] = -b / d;
  };
}

function rcSpice(r: number, c: number) {
  return (inNode: string, _out: string, prefix: string) => {
    const w = new SpiceWriter(prefix);
    w.resistor(inNode, '0', r);
    if (c > 0) w.capacitor(inNode, '0', c);
    return w.lines;
  };
}

const rParam = (def: number, help?: string): ParamSpec =>
  numParam('r', 'Resistance', 'ohm', def, { min: 0, exclusiveMin: true, tolerance: true, help });
const cParam = (def: number, help?: string): ParamSpec =>
  numParam('c', 'Capacitance', 'farad', def, { min: 0, tolerance: true, help });

function rcLoad(
  type: string,
  label: string,
  summary: string,
  rDefault: number,
  cDefault: number,
  help: { r?: string; c?: string } = {},
): StageDefinition {
  const params = [rParam(rDefault, help.r), cParam(cDefault, help.c)];
  return {
    type,
    category: 'load',
    role: 'load',
    label,
    summary,
    params,
    build(values) {
      const p = readParams(params, values);
      return {
        impedance: rParallelC(p.num('r'), p.num('c')),
        spice: rcSpice(p.num('r'), p.num('c')),
      };
    },
  };
}

/** Generic resistance with a capacitance across it. */
export const RC_LOAD = rcLoad(
  'rc-load',
  'R ∥ C load',
  'A resistance with a capacitance across it.',
  50,
  0,
);

/** ADC or receiver-chip input. */
export const ADC_INPUT = rcLoad(
  'adc-input',
  'ADC input',
  'The input of a converter or receiver chip: a resistance with its sampling capacitance.',
  1000,
  5e-12,
  { c: 'Input (sampling) capacitance, pins and traces included; typical values are a few pF.' },
);

/**
 * High-impedance earphone. Typical values (common practice, not a measured part): a
 * magnetic "2000 Ω" earphone or a crystal earpiece is several kΩ with 1–10 nF.
 */
export const EARPHONE_HIGH_Z: StageDefinition = {
  ...rcLoad(
    'earphone-high-z',
    'High-impedance earphone',
    'A magnetic or crystal earpiece: several kilohms with some capacitance.',
    4000,
    2e-9,
  ),
  presets: [
    { key: 'magnetic', label: 'Magnetic, "2000 Ω" class (typical)', values: { r: 4000, c: 2e-9 } },
    { key: 'crystal', label: 'Crystal (piezo) earpiece (typical)', values: { r: 1e6, c: 10e-9 } },
  ],
};

const byDiode = { key: 'inputModel', equals: 'diode' };

const DETECTOR_PARAMS = [
  numParam('rLoad', 'Detector load resistance', 'ohm', 10e3, {
    min: 0,
    exclusiveMin: true,
    tolerance: true,
    help: 'The resistor across the reservoir capacitor; at strong drive the RF input resistance is about half of it.',
  }),
  cParam(3e-12, 'Diode and wiring capacitance seen at the input.'),
  enumParam(
    'inputModel',
    'Input resistance',
    [
      ['half-load', 'Half the load resistance (strong drive)'],
      ['diode', 'From the diode, at the level the chain delivers'],
    ],
    {
      help: 'The diode model follows the drive: n·VT/Is at low level, rising or falling toward half the load resistance at strong drive.',
    },
  ),
  numParam('n', 'Diode ideality factor n', 'ratio', 1.05, {
    min: 1,
    max: 3,
    showWhen: byDiode,
    help: 'About 1.05 for a zero-bias Schottky detector diode, 1.5 to 2 for a germanium point contact (typical, from memory).',
  }),
  numParam('is', 'Diode saturation current Is', 'ampere', 3e-6, {
    min: 0,
    exclusiveMin: true,
    typical: { min: 1e-15, max: 1e-3 },
    showWhen: byDiode,
    help: 'A few µA for a zero-bias Schottky detector diode (typical, from memory); a small Is makes a weak signal see a high resistance.',
  }),
  numParam('minInputPeakV', 'Lowest working input (peak)', 'volt', 0.1, {
    min: 0,
    help: 'Below this the diode is in its square-law region and the detector works poorly.',
  }),
];

/**
 * Diode envelope detector, its RF input resistance in parallel with the diode capacitance:
 * - "half-load": R_load/2 (a peak detector draws its charge in short pulses; the usual
 *   large-signal approximation, common practice);
 * - "diode": from the diode's n and Is at the level the chain delivers (Bessel-function
 *   analysis, see `diode-detector.ts`): n·VT/Is at low drive, toward R_load/2 at strong
 *   drive. The engine settles the level with the chain before the analysis; SPICE has no
 *   single small-signal form of it, so the stage writes none.
 */
export const ENVELOPE_DETECTOR: StageDefinition = {
  type: 'envelope-detector',
  category: 'load',
  role: 'load',
  label: 'Diode envelope detector',
  summary:
    'A diode peak detector: its input resistance is about half its load resistance, or follows the drive level.',
  params: DETECTOR_PARAMS,
  build(values, ctx) {
    const p = readParams(DETECTOR_PARAMS, values);
    const c = p.num('c');
    const detector = { minInputPeakV: p.num('minInputPeakV') };
    if (p.str('inputModel') === 'diode') {
      const parts = {
        rLoad: p.num('rLoad'),
        is: p.num('is'),
        n: p.num('n'),
        temperatureK: ctx.temperatureK,
      };
      const atLevel = (vPeak: number) => rParallelC(detectorInputResistance(vPeak, parts), c);
      return { impedance: atLevel(0), impedanceAtLevel: atLevel, detector };
    }
    const rin = p.num('rLoad') / 2;
    return { impedance: rParallelC(rin, c), detector, spice: rcSpice(rin, c) };
  },
};

const HEADPHONE_PARAMS = [
  rParam(32, 'Voice-coil resistance.'),
  numParam('l', 'Voice-coil inductance', 'henry', 50e-6, { min: 0, tolerance: true }),
];

/** Low-impedance dynamic headphone: R in series with the voice-coil L (typical values). */
export const HEADPHONE_LOW_Z: StageDefinition = {
  type: 'headphone-low-z',
  category: 'load',
  role: 'load',
  label: 'Low-impedance headphone',
  summary: 'A dynamic headphone: tens of ohms in series with the voice-coil inductance.',
  params: HEADPHONE_PARAMS,
  build(values) {
    const p = readParams(HEADPHONE_PARAMS, values);
    const r = p.num('r');
    const l = p.num('l');
    return {
      impedance: (f, out, o) => {
        out[o] = r;
        out[o + 1] = 2 * Math.PI * f * l;
      },
      spice(inNode, _out, prefix) {
        const w = new SpiceWriter(prefix);
        if (l > 0) {
          const mid = w.node();
          w.inductor(inNode, mid, l);
          w.resistor(mid, '0', r);
        } else w.resistor(inNode, '0', r);
        return w.lines;
      },
    };
  },
};
