/**
 * Detectors and loads: one-ports at the end of the chain. Each gives its impedance; none
 * has sections. In SPICE a load is elements from `inNode` to ground.
 */
import type { ComplexFn, ParamSpec, StageDefinition } from '../types';
import { numParam, readParams, SpiceWriter } from './common';

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

const DETECTOR_PARAMS = [
  numParam('rLoad', 'Detector load resistance', 'ohm', 10e3, {
    min: 0,
    exclusiveMin: true,
    tolerance: true,
    help: 'The resistor across the reservoir capacitor; the RF input resistance is about half of it.',
  }),
  cParam(3e-12, 'Diode and wiring capacitance seen at the input.'),
  numParam('minInputPeakV', 'Lowest working input (peak)', 'volt', 0.1, {
    min: 0,
    help: 'Below this the diode is in its square-law region and the detector works poorly.',
  }),
];

/**
 * Diode envelope detector: RF input resistance ≈ R_load/2 (a peak detector draws its
 * charge in short pulses; the usual large-signal approximation, common practice) in
 * parallel with the diode capacitance.
 */
export const ENVELOPE_DETECTOR: StageDefinition = {
  type: 'envelope-detector',
  category: 'load',
  role: 'load',
  label: 'Diode envelope detector',
  summary: 'A diode peak detector: its input resistance is about half its load resistance.',
  params: DETECTOR_PARAMS,
  build(values) {
    const p = readParams(DETECTOR_PARAMS, values);
    const rin = p.num('rLoad') / 2;
    return {
      impedance: rParallelC(rin, p.num('c')),
      detector: { minInputPeakV: p.num('minInputPeakV') },
      spice: rcSpice(rin, p.num('c')),
    };
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
