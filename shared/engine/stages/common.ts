/**
 * Shared plumbing for stage definitions: reading parameter values with their defaults,
 * section factories over impedance functions, and the SPICE line writer.
 */
import { StageParameterError } from '../errors';
import {
  invertParts,
  part,
  PART_C_Y,
  PART_C_Z,
  PART_CONST,
  PART_L_Y,
  PART_L_Z,
  partsFn,
  sumParts,
  type Parts,
} from '../core/parts';
import type {
  AbcdFill,
  BuildContext,
  ComplexFn,
  ParamSpec,
  ParamValues,
  RealFn,
  Section,
} from '../types';
import { seriesImpedanceAbcd, shuntAdmittanceAbcd } from './primitives';

/** Reads values of one stage, falling back to the spec's default for a missing key. */
export interface ParamReader {
  num(key: string): number;
  str(key: string): string;
  bool(key: string): boolean;
}

/** A reader over `values` with the defaults of `specs` (the core has already range-checked). */
export function readParams(specs: ParamSpec[], values: ParamValues): ParamReader {
  const fallback = (key: string): number | string | boolean => {
    const spec = specs.find((s) => s.key === key);
    if (!spec) throw new Error(`stage parameter "${key}" is not in the schema (programming error)`);
    return spec.default;
  };
  const get = (key: string) => (key in values ? values[key] : fallback(key));
  return {
    num(key) {
      const v = get(key);
      if (typeof v !== 'number' || !Number.isFinite(v)) {
        throw new StageParameterError(key, `"${key}" must be a finite number (got ${String(v)})`);
      }
      return v;
    },
    str: (key) => String(get(key)),
    bool: (key) => get(key) === true,
  };
}

/** Lowest own design frequency a stage accepts, Hz (0 still means "the chain's"). */
export const MIN_DESIGN_HZ = 1e-3;

/**
 * The design frequency: the stage's own `f0` when above 0, else the chain's.
 * @throws StageParameterError for an own f0 between 0 and 1 mHz (no part values exist there)
 */
export function designFrequency(own: number, ctx: BuildContext): number {
  if (own > 0 && own < MIN_DESIGN_HZ) {
    throw new StageParameterError(
      'f0',
      `the design frequency must be 0 (use the chain's) or at least 1 mHz (got ${own} Hz)`,
    );
  }
  return own > 0 ? own : ctx.f0Hz;
}

/** A section that is one series impedance: [[1, Z], [0, 1]]. */
export function seriesSection(z: ComplexFn): Section {
  const s = new Float64Array(2);
  const zFill = z.fill;
  return {
    ladder: 'series',
    ...(zFill ? { partFill: zFill } : {}),
    abcd(f, out, o) {
      z(f, s, 0);
      seriesImpedanceAbcd(s[0], s[1], out, o);
    },
    ...(zFill
      ? {
          fill(f, fo, n, out, oo) {
            zFill(f, fo, n, out, oo + 2, 8);
            for (let k = 0, o = oo; k < n; k++, o += 8) {
              out[o] = 1;
              out[o + 1] = 0;
              out[o + 4] = 0;
              out[o + 5] = 0;
              out[o + 6] = 1;
              out[o + 7] = 0;
            }
          },
        }
      : {}),
  };
}

/** A section that is one shunt admittance: [[1, 0], [Y, 1]]. */
export function shuntSection(y: ComplexFn): Section {
  const s = new Float64Array(2);
  const yFill = y.fill;
  return {
    ladder: 'shunt',
    ...(yFill ? { partFill: yFill } : {}),
    abcd(f, out, o) {
      y(f, s, 0);
      shuntAdmittanceAbcd(s[0], s[1], out, o);
    },
    ...(yFill
      ? {
          fill(f, fo, n, out, oo) {
            yFill(f, fo, n, out, oo + 4, 8);
            for (let k = 0, o = oo; k < n; k++, o += 8) {
              out[o] = 1;
              out[o + 1] = 0;
              out[o + 2] = 0;
              out[o + 3] = 0;
              out[o + 6] = 1;
              out[o + 7] = 0;
            }
          },
        }
      : {}),
  };
}

/**
 * A section from its block form alone: the point form evaluates a block of one, so the
 * two cannot disagree.
 */
export function sectionFromFill(
  fill: AbcdFill,
  extras: Omit<Section, 'abcd' | 'fill'> = {},
): Section {
  const fs = new Float64Array(1);
  return {
    ...extras,
    fill,
    abcd(f, out, o) {
      fs[0] = f;
      fill(fs, 0, 1, out, o);
    },
  };
}

/** Sum of complex functions (series impedances, or parallel admittances). */
export function sumOf(...fns: ComplexFn[]): ComplexFn {
  const lists = fns.map((fn) => fn.parts);
  const parts = lists.every((p) => p !== undefined) ? sumParts(lists as Parts[]) : null;
  if (parts) return partsFn(parts);
  const s = new Float64Array(2);
  return (f, out, o) => {
    let re = 0;
    let im = 0;
    for (const fn of fns) {
      fn(f, s, 0);
      re += s[0];
      im += s[1];
    }
    out[o] = re;
    out[o + 1] = im;
  };
}

/** 1/fn: impedance ↔ admittance. */
export function reciprocalOf(fn: ComplexFn): ComplexFn {
  if (fn.parts) return partsFn(invertParts(fn.parts));
  return (f, out, o) => {
    fn(f, out, o);
    const d = out[o] * out[o] + out[o + 1] * out[o + 1];
    out[o] = out[o] / d;
    out[o + 1] = -out[o + 1] / d;
  };
}

/** Impedance of a lossy inductor (constant Q, or a fixed ESR when esr ≥ 0). */
export function inductorZFn(l: number, q: number, esr = -1): ComplexFn {
  return partsFn(part(PART_L_Z, l, q, esr));
}

/** Admittance of a lossy inductor. */
export function inductorYFn(l: number, q: number, esr = -1): ComplexFn {
  return partsFn(part(PART_L_Y, l, q, esr));
}

/** Admittance of a lossy capacitor (constant Q). */
export function capacitorYFn(c: number, q: number): ComplexFn {
  return partsFn(part(PART_C_Y, c, q));
}

/** Impedance of a lossy capacitor (constant Q). */
export function capacitorZFn(c: number, q: number): ComplexFn {
  return partsFn(part(PART_C_Z, c, q));
}

/** A constant complex value. */
export function constantFn(re: number, im = 0): ComplexFn {
  return partsFn(part(PART_CONST, re, im));
}

/** A frequency-independent real value (a source's EMF) with its block form. */
export function constantReal(v: number): RealFn {
  const fn: RealFn = () => v;
  fn.fill = (_f, _fo, n, out, oo) => out.fill(v, oo, oo + n);
  return fn;
}

// ---------------------------------------------------------------- parameter specs

type SpecExtras = Omit<ParamSpec, 'key' | 'label' | 'kind' | 'unit' | 'default'>;

/** A numeric parameter spec. */
export function numParam(
  key: string,
  label: string,
  unit: ParamSpec['unit'],
  def: number,
  extras: SpecExtras = {},
): ParamSpec {
  return { key, label, kind: 'number', unit, default: def, ...extras };
}

/** An enum parameter spec; the first option is the default unless given. */
export function enumParam(
  key: string,
  label: string,
  options: [string, string][],
  extras: SpecExtras & { default?: string } = {},
): ParamSpec {
  const { default: def, ...rest } = extras;
  return {
    key,
    label,
    kind: 'enum',
    unit: 'none',
    default: def ?? options[0][0],
    options: options.map(([value, text]) => ({ value, label: text })),
    ...rest,
  };
}

/** Component quality factor spec (constant-Q loss model). */
export function qParam(
  key: string,
  label: string,
  def: number,
  extras: SpecExtras = {},
): ParamSpec {
  return numParam(key, label, 'ratio', def, {
    min: 0,
    exclusiveMin: true,
    max: 1e12,
    help: 'Unloaded Q of the part at the frequency of use (constant-Q model); 1e12 is lossless.',
    ...extras,
  });
}

/** Q values at or above this are treated as lossless (no loss element in SPICE). */
export const LOSSLESS_Q = 1e12;

/** A number as ngspice reads it. */
export function spiceNum(v: number): string {
  if (!Number.isFinite(v)) throw new Error(`SPICE value must be finite (got ${v})`);
  return String(v);
}

/**
 * Writes ngspice lines for one stage. Element names are the SPICE type letter followed by
 * the stage prefix (SPICE reads the element type from the first letter), e.g. `Ls3_1` for
 * prefix `s3`; internal nodes are `${prefix}_n1`, `${prefix}_n2`, ...
 *
 * Constant-Q losses are frequency-dependent resistors written as ngspice behavioural
 * resistors of the AC-analysis variable `hertz` (R = 2π·hertz·L/Q in series with L,
 * R = Q/(2π·hertz·C) across C), so they are exact at every frequency of an AC sweep.
 */
export class SpiceWriter {
  readonly lines: string[] = [];
  private nodes = 0;
  private names = 0;

  constructor(readonly prefix: string) {}

  /** A fresh internal node name. */
  node(): string {
    this.nodes += 1;
    return `${this.prefix}_n${this.nodes}`;
  }

  /** A fresh element name with the given SPICE letter. */
  name(letter: string): string {
    this.names += 1;
    return `${letter}${this.prefix}_${this.names}`;
  }

  resistor(a: string, b: string, r: number): void {
    this.lines.push(`${this.name('R')} ${a} ${b} ${spiceNum(r)}`);
  }

  capacitor(a: string, b: string, c: number, q = Infinity): void {
    this.lines.push(`${this.name('C')} ${a} ${b} ${spiceNum(c)}`);
    if (q < LOSSLESS_Q) {
      // max() keeps the operating point (hertz = 0) finite.
      this.lines.push(
        `${this.name('R')} ${a} ${b} r={${spiceNum(q)}/(2*pi*max(hertz,1e-3)*${spiceNum(c)})}`,
      );
    }
  }

  /** An inductor with constant-Q loss (or a fixed ESR when esr ≥ 0); returns its L name. */
  inductor(a: string, b: string, l: number, q = Infinity, esr = -1): string {
    const lossy = esr > 0 || (esr < 0 && q < LOSSLESS_Q);
    const mid = lossy ? this.node() : b;
    const name = this.name('L');
    this.lines.push(`${name} ${a} ${mid} ${spiceNum(l)}`);
    if (lossy) {
      const r = esr >= 0 ? spiceNum(esr) : `r={2*pi*hertz*${spiceNum(l)}/${spiceNum(q)}}`;
      this.lines.push(`${this.name('R')} ${mid} ${b} ${r}`);
    }
    return name;
  }

  /** Couples two inductors (by name) with coefficient k. */
  couple(la: string, lb: string, k: number): void {
    this.lines.push(`${this.name('K')} ${la} ${lb} ${spiceNum(k)}`);
  }

  /** A zero-volt source used as a wire between two nodes (keeps node names distinct). */
  wire(a: string, b: string): void {
    this.lines.push(`${this.name('V')} ${a} ${b} 0`);
  }

  raw(line: string): void {
    this.lines.push(line);
  }
}
