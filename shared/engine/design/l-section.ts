/**
 * L-section synthesis: Q = √(Rhigh/Rlow − 1), series reactance Q·Rlow, shunt reactance
 * Rhigh/Q. The shunt element always sits across the higher resistance.
 */
import { formatDesignResult, formatDesignStated } from '../core/format';
import { StageParameterError } from '../errors';

/** Reactance magnitudes of an L-section between two resistances. */
export interface LReactances {
  q: number;
  /** |X| of the series element, Ω. */
  seriesX: number;
  /** |X| of the shunt element, Ω. */
  shuntX: number;
  /** Which port the shunt element sits across (the higher-resistance one). */
  shuntAt: 'port1' | 'port2';
}

/** Checks a design resistance, naming the parameter at fault. */
export function checkResistance(key: string, r: number): void {
  if (!(r > 0) || !Number.isFinite(r)) {
    throw new StageParameterError(key, `${key} must be a resistance above 0 Ω (got ${r})`);
  }
}

/** L-section reactances for port-1 resistance r1 and port-2 resistance r2. */
export function lSectionReactances(r1: number, r2: number): LReactances {
  checkResistance('r1', r1);
  checkResistance('r2', r2);
  if (r1 === r2) {
    throw new StageParameterError(
      'r2',
      `R1 and R2 are both ${r1} Ω: they already match, so no L-section is needed`,
    );
  }
  const rLow = Math.min(r1, r2);
  const rHigh = Math.max(r1, r2);
  const q = Math.sqrt(rHigh / rLow - 1);
  return { q, seriesX: q * rLow, shuntX: rHigh / q, shuntAt: r1 > r2 ? 'port1' : 'port2' };
}

/** Inductance (H) with reactance x (Ω) at f (Hz). */
export function inductanceFor(x: number, f: number): number {
  return x / (2 * Math.PI * f);
}

/** Capacitance (F) with reactance magnitude x (Ω) at f (Hz). */
export function capacitanceFor(x: number, f: number): number {
  return 1 / (2 * Math.PI * f * x);
}

/**
 * Shunt capacitance left after a parasitic `parasiticC` already across the node is taken
 * out of the designed value.
 */
export function subtractParasitic(designedC: number, parasiticC: number): number {
  const left = designedC - parasiticC;
  if (parasiticC > 0 && !(left > 0)) {
    throw new StageParameterError(
      'parasiticC',
      `the parasitic ${formatDesignStated(parasiticC * 1e12)} pF is more than the designed shunt ` +
        `${formatDesignResult(designedC * 1e12)} pF, so it cannot be absorbed: lower Q, ` +
        'use a high-pass form (the shunt L resonates the parasitic out) or reduce the parasitic',
    );
  }
  return left;
}

/**
 * Shunt inductance that both gives the designed shunt inductance and resonates a parasitic
 * capacitance out at f: Lres = 1/(ω²·C), L = Lp ∥ Lres.
 */
export function absorbIntoShuntL(designedL: number, parasiticC: number, f: number): number {
  if (!(parasiticC > 0)) return designedL;
  const w = 2 * Math.PI * f;
  const lRes = 1 / (w * w * parasiticC);
  return (designedL * lRes) / (designedL + lRes);
}
