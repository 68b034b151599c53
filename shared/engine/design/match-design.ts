/**
 * Matching-network synthesis: L-sections, pi and T through a virtual resistance, two
 * cascaded L-sections through the geometric mean, and the tapped-capacitor transformer.
 * All resistances are real; port 1 sees r1, port 2 is terminated in r2 (with an optional
 * parasitic shunt capacitance across it, absorbed into the design where the topology can).
 */
import { formatDesignResult } from '../core/format';
import { StageParameterError } from '../errors';
import {
  absorbIntoShuntL,
  capacitanceFor,
  checkResistance,
  inductanceFor,
  lSectionReactances,
  subtractParasitic,
} from './l-section';

export type MatchKind = 'l-lowpass' | 'l-highpass' | 'pi' | 't' | 'double-l' | 'tapped-c';

export interface MatchSpec {
  /** Resistance seen at port 1, Ω. */
  r1: number;
  /** Resistance terminating port 2, Ω. */
  r2: number;
  /** Design frequency, Hz. */
  f0: number;
  /** Loaded Q (pi: at the higher-R side; T: at the lower-R side; tapped-C: of the tank). */
  q?: number;
  /** Capacitance already across port 2, F. */
  parasiticC?: number;
}

/** A synthesised network: component values (SI) keyed as in the stage's values mode. */
export interface MatchDesign {
  kind: MatchKind;
  /** Highest nodal Q of the network (what the parts' Q must comfortably exceed). */
  q: number;
  /** L-sections and double-L: where the first shunt element sits. */
  shuntAt?: 'port1' | 'port2';
  values: Record<string, number>;
}

function checkFrequency(f0: number): void {
  if (!(f0 > 0) || !Number.isFinite(f0)) {
    throw new StageParameterError('f0', `the design frequency must be above 0 Hz (got ${f0})`);
  }
}

function noParasiticHere(parasiticC: number, where: string): void {
  if (parasiticC > 0) {
    throw new StageParameterError(
      'parasiticC',
      `a parasitic capacitance at port 2 can be absorbed only by a shunt element there; ${where}`,
    );
  }
}

/** L-section, low-pass (series L, shunt C) or high-pass (series C, shunt L). Values {l, c}. */
export function designLSection(spec: MatchSpec, form: 'lowpass' | 'highpass'): MatchDesign {
  checkFrequency(spec.f0);
  const { q, seriesX, shuntX, shuntAt } = lSectionReactances(spec.r1, spec.r2);
  const parasiticC = spec.parasiticC ?? 0;
  if (shuntAt === 'port1') {
    noParasiticHere(parasiticC, 'here R1 > R2 puts the shunt element at port 1');
  }
  const f = spec.f0;
  if (form === 'lowpass') {
    const c = capacitanceFor(shuntX, f);
    return {
      kind: 'l-lowpass',
      q,
      shuntAt,
      values: { l: inductanceFor(seriesX, f), c: subtractParasitic(c, parasiticC) },
    };
  }
  const lp = inductanceFor(shuntX, f);
  return {
    kind: 'l-highpass',
    q,
    shuntAt,
    values: { c: capacitanceFor(seriesX, f), l: absorbIntoShuntL(lp, parasiticC, f) },
  };
}

function checkQ(q: number | undefined, minimum: number, what: string): number {
  if (q === undefined || !(q > minimum)) {
    throw new StageParameterError(
      'q',
      `${what} needs a loaded Q above ${formatDesignResult(minimum)} for these resistances (got ${q})`,
    );
  }
  return q;
}

/**
 * Low-pass pi (shunt C1 at port 1, series L, shunt C2 at port 2): two back-to-back
 * L-sections meeting at Rv = Rhigh/(Q² + 1), Q taken at the higher-R side.
 */
export function designPi(spec: MatchSpec): MatchDesign {
  checkFrequency(spec.f0);
  checkResistance('r1', spec.r1);
  checkResistance('r2', spec.r2);
  const rHigh = Math.max(spec.r1, spec.r2);
  const rLow = Math.min(spec.r1, spec.r2);
  const q = checkQ(spec.q, Math.sqrt(rHigh / rLow - 1), 'a pi network');
  const rv = rHigh / (q * q + 1);
  const q1 = Math.sqrt(spec.r1 / rv - 1);
  const q2 = Math.sqrt(spec.r2 / rv - 1);
  const f = spec.f0;
  return {
    kind: 'pi',
    q,
    values: {
      c1: capacitanceFor(spec.r1 / q1, f),
      l: inductanceFor(rv * (q1 + q2), f),
      c2: subtractParasitic(capacitanceFor(spec.r2 / q2, f), spec.parasiticC ?? 0),
    },
  };
}

/**
 * Low-pass T (series L1, shunt C, series L2): two back-to-back L-sections meeting at
 * Rv = Rlow·(Q² + 1), Q taken at the lower-R side.
 */
export function designT(spec: MatchSpec): MatchDesign {
  checkFrequency(spec.f0);
  checkResistance('r1', spec.r1);
  checkResistance('r2', spec.r2);
  noParasiticHere(spec.parasiticC ?? 0, 'a T ends in a series inductor: use a pi or L-section');
  const rHigh = Math.max(spec.r1, spec.r2);
  const rLow = Math.min(spec.r1, spec.r2);
  const q = checkQ(spec.q, Math.sqrt(rHigh / rLow - 1), 'a T network');
  const rv = rLow * (q * q + 1);
  const q1 = Math.sqrt(rv / spec.r1 - 1);
  const q2 = Math.sqrt(rv / spec.r2 - 1);
  const f = spec.f0;
  return {
    kind: 't',
    q,
    values: {
      l1: inductanceFor(q1 * spec.r1, f),
      c: capacitanceFor(rv / (q1 + q2), f),
      l2: inductanceFor(q2 * spec.r2, f),
    },
  };
}

/**
 * Two cascaded low-pass L-sections through Rm = √(R1·R2); both have Q = √(Rhigh/Rm − 1),
 * lower than one L-section's, hence the wider band. Values {l1, c1, l2, c2} in the order
 * the elements appear from port 1; shuntAt says whether port 1 starts with a shunt C.
 */
export function designDoubleL(spec: MatchSpec): MatchDesign {
  checkFrequency(spec.f0);
  const first = lSectionReactances(spec.r1, Math.sqrt(spec.r1 * spec.r2));
  const rm = Math.sqrt(spec.r1 * spec.r2);
  const second = lSectionReactances(rm, spec.r2);
  const f = spec.f0;
  const parasiticC = spec.parasiticC ?? 0;
  if (first.shuntAt === 'port2') {
    // Step-up: series L1, shunt C1 at Rm, series L2, shunt C2 across R2.
    return {
      kind: 'double-l',
      q: first.q,
      shuntAt: 'port2',
      values: {
        l1: inductanceFor(first.seriesX, f),
        c1: capacitanceFor(first.shuntX, f),
        l2: inductanceFor(second.seriesX, f),
        c2: subtractParasitic(capacitanceFor(second.shuntX, f), parasiticC),
      },
    };
  }
  noParasiticHere(parasiticC, 'a step-down double L ends in a series inductor');
  // Step-down: shunt C1 across R1, series L1, shunt C2 at Rm, series L2.
  return {
    kind: 'double-l',
    q: first.q,
    shuntAt: 'port1',
    values: {
      c1: capacitanceFor(first.shuntX, f),
      l1: inductanceFor(first.seriesX, f),
      c2: capacitanceFor(second.shuntX, f),
      l2: inductanceFor(second.seriesX, f),
    },
  };
}
