/**
 * Contracts of the analysis engine. Framework-free: nothing here imports Angular,
 * Express or MikroORM.
 *
 * Canonical numeric form:
 * - frequency in Hz;
 * - a complex number inside hot loops is two adjacent float64 slots (re, im);
 * - an ABCD matrix at one frequency is 8 slots [Are, Aim, Bre, Bim, Cre, Cim, Dre, Dim];
 *   a sweep of n points is one Float64Array of length 8·n, point i at offset 8·i.
 * Voltages and currents are PEAK phasors; reports say so and add rms where users expect it.
 */
import type { ComplexJson } from './result-types';

export type UnitKind =
  | 'ohm'
  | 'henry'
  | 'farad'
  | 'hertz'
  | 'volt'
  | 'ampere'
  | 'volt-per-metre'
  | 'watt'
  | 'siemens'
  | 'metre'
  | 'kelvin'
  | 'degree'
  | 'db'
  | 'dbm'
  | 'ratio'
  | 'percent'
  | 'none';

export interface ParamOption {
  value: string;
  label: string;
}

/** One entry of a stage type's parameter schema. The client builds its form from these. */
export interface ParamSpec {
  key: string;
  label: string;
  /** `text`: a short string value (at most 200 characters, e.g. a compact measured table). */
  kind: 'number' | 'enum' | 'boolean' | 'text';
  unit: UnitKind;
  default: number | string | boolean;
  /** Inclusive lower bound unless `exclusiveMin`. */
  min?: number;
  exclusiveMin?: boolean;
  max?: number;
  /**
   * The range a practising designer expects (inclusive). A value inside the hard range but
   * outside this one is accepted with a warning on the field and a flag: it is most likely a
   * typing slip (a "2.2k" capacitor).
   */
  typical?: { min?: number; max?: number };
  options?: ParamOption[];
  /** Whether the value may carry a tolerance (Monte Carlo). */
  tolerance?: boolean;
  /** Shown under the input. */
  help?: string;
  /** Show (and validate) only when another parameter has this value. */
  showWhen?: { key: string; equals: string | boolean | number };
}

export type StageCategory =
  'source' | 'coupler' | 'matching' | 'filter' | 'amplifier' | 'mixer' | 'load' | 'element';

export type ParamValues = Record<string, number | string | boolean>;

export type Caution = 'high-voltage' | 'transmit' | 'rf-exposure';

/**
 * A complex value of frequency: `fn(f, out, o)` writes (re, im) into out[o], out[o+1].
 * It may also carry its block form and, when it is a sum of lossy parts, the parts as data
 * (`core/parts.ts`); the node analysis then evaluates it without a call per point.
 */
export interface ComplexFn {
  (f: number, out: Float64Array, o: number): void;
  /**
   * Block form: the values at f[fo … fo+n−1], point k's (re, im) at out[oo + stride·k] and
   * the slot after. Must equal the point form and allocate nothing.
   */
  fill?: (
    f: Float64Array,
    fo: number,
    n: number,
    out: Float64Array,
    oo: number,
    stride: number,
  ) => void;
  /** The lossy parts this value sums (see `core/parts.ts`). */
  parts?: Float64Array;
}

/** A real value of frequency (a source's EMF), optionally with its block form. */
export interface RealFn {
  (f: number): number;
  /** Block form: the values at f[fo … fo+n−1] into out[oo … oo+n−1]; allocates nothing. */
  fill?: (f: Float64Array, fo: number, n: number, out: Float64Array, oo: number) => void;
}

/** Writes one ABCD matrix (8 slots) into out[o..o+7]. */
export type AbcdFn = (f: number, out: Float64Array, o: number) => void;

/**
 * Block form of a section's ABCD: the matrices at f[fo … fo+n−1], point k's 8 slots at
 * out[oo + 8·k]. Must equal the point form `abcd` and allocate nothing.
 */
export type AbcdFill = (
  f: Float64Array,
  fo: number,
  n: number,
  out: Float64Array,
  oo: number,
) => void;

/**
 * One elementary two-port inside a stage. A stage is a list of sections; the nodes
 * between sections are internal nodes of the stage (numbered 1..sections-1 inside it;
 * 0 = stage input, sections.length = stage output).
 */
export interface Section {
  abcd: AbcdFn;
  /**
   * Optional block form. Without it the node analysis calls `abcd` once per point, which
   * costs a call and a boxed frequency each time; the common section factories give one.
   */
  fill?: AbcdFill;
  /** Unilateral (y12 = 0): the backward pass restarts at its input. */
  unilateral?: boolean;
  /**
   * One part of a ladder: 'shunt', one admittance across the line (ABCD [[1, 0], [Y, 1]] at
   * every frequency, so the voltage at its output is the voltage at its input and the node
   * analysis copies it instead of dividing), or 'series', one impedance in the line
   * ([[1, Z], [0, 1]]). Set by the factories that guarantee the matrix (`shuntSection`,
   * `seriesSection`), never inferred. One property for both, so their objects share one shape:
   * a flag of each kind gave the megamorphic property loads of the node analysis one shape more,
   * and it then allocated a few KiB after every full collection, re-making their caches.
   */
  ladder?: 'shunt' | 'series';
  /**
   * With `ladder`: the block form of its one part (Y, or Z), which the node analysis's block
   * loops call to write that value alone into the matrix's C (shunt) or B (series) slots: the
   * ladder's steps (core/ladder-steps.ts) read nothing else there, so the six constant slots
   * `fill` writes per point are not written.
   */
  partFill?: NonNullable<ComplexFn['fill']>;
  /** Frequency at the section's output for frequency f at its input (mixers). */
  translate?: (f: number) => number;
}

/** A resonator a stage declares about itself. */
export type ResonatorDecl =
  | {
      kind: 'shunt';
      label: string;
      /** Stage-local node (0..sections.length) the tank sits at; the tank is on the source side of it. */
      node: number;
      /** The tank's own admittance (its lossy L and C only), for unloaded Q. */
      ownAdmittance: ComplexFn;
      /**
       * Set for one tank of a coupled pair: the side its partner tank lies on. The node's
       * total susceptance then carries the partner's resonance as well, so the tank's Q is
       * worked from its own susceptance slope and the conductances at its node instead.
       * A tank whose partner is downstream is loaded by its partner on purpose: no loading
       * ratio is reported for it.
       */
      coupledPartner?: 'upstream' | 'downstream';
    }
  | {
      kind: 'series';
      label: string;
      /** Index of the section that is the series resonator (a series impedance). */
      section: number;
      /** The resonator's own series impedance, for unloaded Q. */
      ownImpedance: ComplexFn;
    };

export type NoiseDecl =
  | { kind: 'passive' }
  | {
      kind: 'figure';
      nfDb: number;
      /**
       * Source impedance the figure was stated at, ohm (it holds only there): resistance
       * and reactance (0 when absent).
       */
      ratedSourceOhm?: number;
      ratedSourceX?: number;
    }
  | {
      kind: 'parameters';
      fminDb: number;
      /** Equivalent noise resistance, ohm. */
      rn: number;
      /** Optimum source admittance, siemens (re, im). */
      yoptRe: number;
      yoptIm: number;
    };

/** Where a stage sits in a chain: first (source), in between (two-port) or last (load). */
export type StageRole = 'source' | 'two-port' | 'load';

/** What every built stage may tell the engine, whatever its role. */
export interface StageModelCommon {
  resonators?: ResonatorDecl[];
  noise?: NoiseDecl;
  linearity?: { iip3Dbm?: number; p1dbDbm?: number };
  /**
   * Mixers (optional): the local oscillator, so the image frequency is stated exactly. When
   * absent the engine derives it from the sections' `translate`.
   */
  mixer?: { loHz: number; product: 'difference' | 'sum' };
  /**
   * Converters (loads): a full-scale sine's power into the input resistance (W), the SNR of
   * that sine over the Nyquist band (dB), the sample rate, and the bandwidth the processing
   * keeps (Hz; 0 = the chain's channel bandwidth).
   */
  converter?: {
    fullScaleW: number;
    snrDb: number;
    sampleRateHz: number;
    processingBandwidthHz: number;
  };
  /** Detectors: the lowest input level (PEAK volts) at which they work properly. */
  detector?: { minInputPeakV: number };
  /** Matching networks: the resistances it was designed to match (for the mismatch flag). */
  designedMatch?: { r1: number; r2: number };
  /** Matching networks: loaded Q the design needs versus what its parts have. */
  qBudget?: { required: number; componentQ: number };
  /**
   * A branch to ground meant to block (present a high impedance) or pass (a low one) at f0:
   * it is judged as such, against `ratio` times the impedance it shunts, not as a tank.
   */
  trap?: { intent: 'high' | 'low'; ratio: number; impedance: ComplexFn };
  /**
   * Parts hidden inside one section (a branch to ground): the voltage across and current
   * through each, for a PEAK voltage (vRe, vIm) at the stage's input, at frequency f.
   */
  innerParts?: (f: number, vRe: number, vIm: number) => PartStress[];
  /**
   * Matching networks entered "by design": the part values the design chose (SI), keyed
   * like the stage's own value parameters (`l`, `c`, …), so a card can show them.
   */
  designedValues?: Record<string, number>;
  /**
   * SPICE (ngspice) lines for the stage between nodes `inNode` and `outNode`
   * (ground is `0`). Element names must start with `prefix`. Undefined when SPICE
   * cannot express the stage. Sources write a voltage source named `${prefix}V`;
   * loads write only elements from `inNode` to ground.
   */
  spice?: (inNode: string, outNode: string, prefix: string) => string[];
}

/** One part's stress: PEAK volts across it, PEAK amperes through it, watts it takes. */
export interface PartStress {
  label: string;
  vPeak: number;
  iPeak: number;
  powerW: number;
  /** The part stands for the receiver's input (its power is what reaches the receiver). */
  receiverInput?: boolean;
}

/** A built source: an open-circuit EMF behind an impedance. */
export interface SourceModel extends StageModelCommon {
  /** Open-circuit EMF (PEAK volts) at frequency f. */
  emf: RealFn;
  /** Source impedance. */
  impedance: ComplexFn;
}

/** A built two-port: its sections in order, port 1 to port 2. */
export interface TwoPortModel extends StageModelCommon {
  sections: Section[];
}

/** A built load: a one-port impedance to ground. */
export interface LoadModel extends StageModelCommon {
  impedance: ComplexFn;
  /**
   * Loads whose input impedance depends on the drive (a diode detector): the impedance when
   * the node carries `vPeak` volts at f0. The engine solves for the level the chain delivers
   * and uses that impedance over the whole sweep (a linearisation at the working level).
   */
  impedanceAtLevel?: (vPeak: number) => ComplexFn;
}

/** The model a stage of each role builds. */
export interface ModelOfRole {
  source: SourceModel;
  'two-port': TwoPortModel;
  load: LoadModel;
}

/** What a built stage tells the engine: one shape per role. */
export type StageModel = ModelOfRole[StageRole];

/** Context handed to a stage's builder. */
export interface BuildContext {
  /** Design frequency of the chain at the stage's input (translated after a mixer). */
  f0Hz: number;
  /**
   * Highest frequency at the stage's input that the analysis may evaluate (the sweep and the
   * resonance searches, translated like f0), Hz; an upper bound. Optional: builders that
   * compute something which grows with frequency check it here (a lossy line's loss).
   */
  fMaxHz?: number;
  temperatureK: number;
  /**
   * The stage's attached data file, parsed (measured antenna: one-port; measured two-port:
   * two-port). Optional: measured stages fall back to their text table parameter.
   */
  dataFile?: MeasuredNetwork;
}

/** One frequency point of measured S-parameters (one-port: s11 only), real reference z0. */
export interface SParamPoint {
  f: number;
  z0: number;
  s11: ComplexJson;
  s21?: ComplexJson;
  s12?: ComplexJson;
  s22?: ComplexJson;
}

/** A parsed measurement (e.g. from a Touchstone file), points in ascending frequency. */
export interface MeasuredNetwork {
  ports: 1 | 2;
  points: SParamPoint[];
  /** Two-port noise parameters (e.g. a Touchstone file's noise block), ascending frequency. */
  noise?: MeasuredNoisePoint[];
}

/** Noise parameters of a measured two-port at one frequency. */
export interface MeasuredNoisePoint {
  fHz: number;
  nfMinDb: number;
  /** Optimum source reflection coefficient against `z0`. */
  gammaOpt: ComplexJson;
  /** Equivalent noise resistance, ohm. */
  rnOhm: number;
  /** Reference resistance of `gammaOpt`, ohm. */
  z0: number;
}

/** What a stage type is, apart from how it builds (also what clients receive). */
export interface StageTypeInfo {
  type: string;
  category: StageCategory;
  role: StageRole;
  label: string;
  /** One sentence for the palette. */
  summary: string;
  params: ParamSpec[];
  presets?: { key: string; label: string; values: ParamValues }[];
  cautions?: Caution[];
}

/** A stage type of one role, with the builder of that role's model. */
export interface RoleStageDefinition<R extends StageRole> extends StageTypeInfo {
  role: R;
  /** Throws StageParameterError for values the model cannot take (after schema checks). */
  build(values: ParamValues, ctx: BuildContext): ModelOfRole[R];
}

export type SourceDefinition = RoleStageDefinition<'source'>;
export type TwoPortDefinition = RoleStageDefinition<'two-port'>;
export type LoadDefinition = RoleStageDefinition<'load'>;

/** A stage type of the catalogue; its `role` says which model its `build` returns. */
export type StageDefinition = SourceDefinition | TwoPortDefinition | LoadDefinition;

export * from './result-types';
