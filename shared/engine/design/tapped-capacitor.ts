/**
 * Tapped-capacitor transformer: a tank inductor L across port 1, C1 from port 1 down to the
 * tap, C2 from the tap to ground, and the port-2 load R2 across C2.
 *
 *   port 1 o───┬──────┬───          R1 (high) at the top of the tank
 *              L      C1
 *              │      ├────o port 2  R2 (low) at the tap
 *              │      C2
 *   ground  ───┴──────┴───
 *
 * The high-Q rule of thumb is V2/V1 = √(R2/R1) = C1/(C1 + C2), i.e. R1 ≈ R2·(1 + C2/C1)²;
 * it holds only while the tap Q = ω·C2·R2 is large. The design here is exact: R2 ∥ C2 is
 * turned into its series form Rs = R2/(1 + Q2²), C1 is added, and the parallel form at the
 * top must be R1 ∥ Cp with Cp resonating L at f0.
 */
import { formatDesignResult, formatDesignStated } from '../core/format';
import { StageParameterError } from '../errors';
import { checkResistance } from './l-section';
import type { MatchDesign, MatchSpec } from './match-design';

/** Parallel equivalent at the top of C1 of the tap network loaded by rl, at f. */
export interface TapEquivalent {
  /** Parallel resistance, Ω. */
  rp: number;
  /** Parallel capacitance, F. */
  cp: number;
  /** Inductance that resonates cp at f, H. */
  lTune: number;
  /** The high-Q approximation R' = RL·(1 + C2/C1)², Ω, and its series C, F. */
  approxR: number;
  approxC: number;
}

/**
 * Exact analysis: Y = 1/[1/(jωC1) + (RL ∥ 1/(jωC2))], Rp = 1/Re Y, Cp = Im Y/ω.
 */
export function tappedCapacitorEquivalent(
  c1: number,
  c2: number,
  rl: number,
  f: number,
): TapEquivalent {
  const w = 2 * Math.PI * f;
  // RL ∥ C2 = RL/(1 + jωC2·RL)
  const q2 = w * c2 * rl;
  const d = 1 + q2 * q2;
  const zr = rl / d;
  const zi = -(rl * q2) / d - 1 / (w * c1);
  const m = zr * zr + zi * zi;
  const yr = zr / m;
  const yi = -zi / m;
  const cp = yi / w;
  const n = 1 + c2 / c1;
  return {
    rp: 1 / yr,
    cp,
    lTune: 1 / (w * w * cp),
    approxR: rl * n * n,
    approxC: (c1 * c2) / (c1 + c2),
  };
}

/**
 * Exact design for R1 at the top (tank side) and R2 at the tap. `q` is the loaded Q of the
 * tank with both the source R1 and the transformed load (together R1/2) across it, so the
 * tank reactance is X = R1/(2Q) and the top's own parallel Q is Qp = R1·ωCp = 2Q.
 * Values {l, c1, c2}; a parasitic across port 2 is taken out of C2.
 */
export function designTappedCapacitor(spec: MatchSpec): MatchDesign {
  const { r1, r2, f0 } = spec;
  checkResistance('r1', r1);
  checkResistance('r2', r2);
  if (!(f0 > 0)) throw new StageParameterError('f0', `the design frequency must be above 0 Hz`);
  if (!(r1 > r2)) {
    throw new StageParameterError(
      'r1',
      `a tapped-capacitor transformer steps down from the tank (port 1) to the tap: R1 ` +
        `(${r1} Ω) must be above R2 (${r2} Ω); swap the ports`,
    );
  }
  const q = spec.q;
  const qp = 2 * (q ?? 0);
  const rs = r1 / (1 + qp * qp);
  if (q === undefined || !(q > 0) || !(rs < r2)) {
    const minQ = Math.sqrt(r1 / r2 - 1) / 2;
    throw new StageParameterError(
      'q',
      `a tapped-capacitor transformer from ${r1} Ω to ${r2} Ω needs a loaded Q above ` +
        `${formatDesignResult(minQ)} (got ${q})`,
    );
  }
  const w = 2 * Math.PI * f0;
  const q2 = Math.sqrt(r2 / rs - 1);
  const c2 = q2 / (w * r2);
  // Series reactance needed at the top: −Rs·Qp; R2 ∥ C2 supplies −Rs·Q2, C1 the rest.
  const c1 = 1 / (w * rs * (qp - q2));
  const cp = qp / (w * r1);
  return {
    kind: 'tapped-c',
    q,
    values: {
      l: 1 / (w * w * cp),
      c1,
      c2:
        c2 - (spec.parasiticC ?? 0) > 0 ? c2 - (spec.parasiticC ?? 0) : parasiticTooLarge(c2, spec),
    },
  };
}

function parasiticTooLarge(c2: number, spec: MatchSpec): never {
  throw new StageParameterError(
    'parasiticC',
    `the parasitic ${formatDesignStated((spec.parasiticC ?? 0) * 1e12)} pF is more than the ` +
      `designed C2 ${formatDesignResult(c2 * 1e12)} pF: raise Q or lower the parasitic`,
  );
}
