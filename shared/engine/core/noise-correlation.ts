/**
 * Exact noise figure of a chain by the noise-correlation-matrix method (H. Hillbrand and
 * P. H. Russer, "An efficient method for computer aided noise analysis of linear amplifier
 * networks", IEEE Trans. Circuits and Systems, 1976), as a cross-check of the Friis cascade.
 *
 * Each two-port gets a chain-form correlation matrix C_A of its input-referred noise voltage
 * and current (per hertz, in the ½-normalised form where a resistor R has 2kTR):
 * - a passive section at temperature T: C_Z = 2kT·herm(Z) moved to chain form by
 *   T_ZA = [[1, −A], [0, −C]], or C_Y = 2kT·herm(Y) by T_YA = [[0, B], [1, D]] when the
 *   section has no Z-parameters (a series element);
 * - an active stage with noise parameters: 2kT0·[[Rn, (Fmin−1)/2 − Rn·Yopt*],
 *   [(Fmin−1)/2 − Rn·Yopt, Rn·|Yopt|²]]; a stated noise figure F is taken as a noise voltage
 *   alone, (F − 1)·Re Zs·2kT0, so it holds at the source impedance the stage sees.
 * Cascade: C = C₁ + A₁·C₂·A₁ᴴ; F = 1 + [1 Zs]·C·[1 Zs]ᴴ / (2kT0·Re Zs).
 * Frequency translation is taken as transparent (single-sideband, image noise ignored).
 */
import type { BuiltChain, BuiltStage } from './build';
import { cascade } from './abcd';
import { hypot2 } from './hypot';
import { BOLTZMANN } from './noise';
import { runNodeAnalysis, type NodeAnalysis } from './nodes';

type M2 = Float64Array; // [11re, 11im, 12re, 12im, 21re, 21im, 22re, 22im]

/**
 * out = X·C·Xᴴ for complex 2×2 matrices, through `t` (X·C) and `xh` (Xᴴ), eight slots each;
 * `out` may be `c` (C is read whole before out is written).
 */
function congruenceInto(x: M2, c: M2, out: M2, t: M2, xh: M2): M2 {
  cascade(x, 0, c, 0, t, 0);
  xh[0] = x[0];
  xh[1] = -x[1];
  xh[2] = x[4];
  xh[3] = -x[5];
  xh[4] = x[2];
  xh[5] = -x[3];
  xh[6] = x[6];
  xh[7] = -x[7];
  cascade(t, 0, xh, 0, out, 0);
  return out;
}

/** Hermitian part (M + Mᴴ)/2 scaled by s, into out. */
function hermitianInto(m: M2, s: number, out: M2): M2 {
  out[0] = s * m[0];
  out[1] = 0;
  out[2] = (s * (m[2] + m[4])) / 2;
  out[3] = (s * (m[3] - m[5])) / 2;
  out[4] = (s * (m[4] + m[2])) / 2;
  out[5] = (s * (m[5] - m[3])) / 2;
  out[6] = s * m[6];
  out[7] = 0;
  return out;
}

/** Writes the eight values into out. */
function put(
  out: M2,
  v0: number,
  v1: number,
  v2: number,
  v3: number,
  v4: number,
  v5: number,
  v6: number,
  v7: number,
): M2 {
  out[0] = v0;
  out[1] = v1;
  out[2] = v2;
  out[3] = v3;
  out[4] = v4;
  out[5] = v5;
  out[6] = v6;
  out[7] = v7;
  return out;
}

/** The 2×2 scratch matrices of {@link passiveCorrelationInto}. */
interface CorrelationScratch {
  /** Z or Y of the section, its Hermitian part, the move to chain form, X·C and Xᴴ. */
  m: M2;
  h: M2;
  x: M2;
  t: M2;
  xh: M2;
}

const scratchMatrices = (): CorrelationScratch => ({
  m: new Float64Array(8),
  h: new Float64Array(8),
  x: new Float64Array(8),
  t: new Float64Array(8),
  xh: new Float64Array(8),
});

/** Chain-form correlation matrix of a passive section with ABCD `a` at temperature T. */
export function passiveCorrelation(a: M2, temperatureK: number): M2 {
  return passiveCorrelationInto(a, temperatureK, new Float64Array(8), scratchMatrices());
}

/** {@link passiveCorrelation} into `out` (not `a`), through the scratch `w`. */
function passiveCorrelationInto(a: M2, temperatureK: number, out: M2, w: CorrelationScratch): M2 {
  const kt2 = 2 * BOLTZMANN * temperatureK;
  const ar = a[0], ai = a[1], br = a[2], bi = a[3], cr = a[4], ci = a[5], dr = a[6], di = a[7]; // prettier-ignore
  const cMag = hypot2(cr, ci);
  const bMag = hypot2(br, bi);
  if (cMag === 0 && bMag === 0) return put(out, 0, 0, 0, 0, 0, 0, 0, 0); // transformer-like: lossless
  const unitDiagonal = ar === 1 && ai === 0 && dr === 1 && di === 0;
  // A bare series impedance is a noise voltage 2kT·Re Z; a bare shunt admittance a noise
  // current 2kT·Re Y (the general forms below divide by a zero C or B for these).
  if (unitDiagonal && cMag === 0) return put(out, kt2 * br, 0, 0, 0, 0, 0, 0, 0);
  if (unitDiagonal && bMag === 0) return put(out, 0, 0, 0, 0, 0, 0, kt2 * cr, 0);
  const detR = ar * dr - ai * di - (br * cr - bi * ci);
  const detI = ar * di + ai * dr - (br * ci + bi * cr);
  // Pick the representation that exists and is better conditioned (scaled to 50 Ω). The
  // products are written out (x·y for complex x, y: re = xr·yr − xi·yi, im = xr·yi + xi·yr).
  if (cMag * 2500 >= bMag) {
    const d = cr * cr + ci * ci;
    const icr = cr / d;
    const ici = -ci / d;
    put(w.m,
      ar * icr - ai * ici, ar * ici + ai * icr,
      detR * icr - detI * ici, detR * ici + detI * icr,
      icr, ici,
      dr * icr - di * ici, dr * ici + di * icr,
    ); // prettier-ignore
    put(w.x, 1, 0, -ar, -ai, 0, 0, -cr, -ci);
    return congruenceInto(w.x, hermitianInto(w.m, kt2, w.h), out, w.t, w.xh);
  }
  const d = br * br + bi * bi;
  const ibr = br / d;
  const ibi = -bi / d;
  const ndr = -detR;
  const ndi = -detI;
  put(w.m,
    dr * ibr - di * ibi, dr * ibi + di * ibr,
    ndr * ibr - ndi * ibi, ndr * ibi + ndi * ibr,
    -ibr, -ibi,
    ar * ibr - ai * ibi, ar * ibi + ai * ibr,
  ); // prettier-ignore
  put(w.x, 0, 0, br, bi, 1, 0, dr, di);
  return congruenceInto(w.x, hermitianInto(w.m, kt2, w.h), out, w.t, w.xh);
}

/**
 * Chain-form correlation matrix of the two-ports (and, with `withLoad`, a load that declares
 * its own noise) in cascade at f0, with the node analysis it was read from.
 * @param atF0 the chain's node analysis at f0 alone (one point, every node's row), when the
 *   caller has it: read instead of a new one
 */
function cascadeCorrelation(built: BuiltChain, withLoad: boolean, atF0?: NodeAnalysis) {
  const t0 = built.settings.temperatureK;
  const kt2 = 2 * BOLTZMANN * t0;
  const f0 = built.settings.f0Hz;
  const na =
    atF0 && atF0.points === 1 && atF0.freqs[0] === f0 && !atF0.zRow
      ? atF0
      : runNodeAnalysis(built, [f0]);
  // The units are gathered in the chain's order, then folded from the last one back
  // (C = C₁ + A₁·(C₂ + A₂·(…)·A₂ᴴ)·A₁ᴴ) through one running total and scratch.
  const units: { a: M2; c: M2 }[] = [];
  // A load that declares its own noise (a converter or receiver input) ends the cascade as
  // noise sources at its terminals, behind a through connection.
  const stages = built.twoPorts;
  const w = scratchMatrices();
  const count = stages.length + (withLoad ? 1 : 0);
  for (let s = 0; s < count; s++) {
    const stage: BuiltStage = s < stages.length ? stages[s] : built.load;
    const decl = stage.model.noise;
    if (stage === built.load && (!decl || decl.kind === 'passive')) continue;
    const sections = 'sections' in stage.model ? stage.model.sections : [];
    if (!decl || decl.kind === 'passive') {
      for (let k = 0; k < sections.length; k++) {
        const a = new Float64Array(8);
        sections[k].abcd(built.f0AtFlatNode[stage.firstSection + k], a, 0);
        units.push({ a, c: passiveCorrelationInto(a, t0, new Float64Array(8), w) });
      }
      continue;
    }
    const a = Float64Array.of(1, 0, 0, 0, 0, 0, 1, 0);
    const m = new Float64Array(8);
    for (let k = 0; k < sections.length; k++) {
      sections[k].abcd(built.f0AtFlatNode[stage.firstSection + k], m, 0);
      cascade(a, 0, m, 0, a, 0);
    }
    let c: M2;
    if (decl.kind === 'figure') {
      const rs = na.zsrcRe[stage.firstSection];
      c = Float64Array.of(kt2 * (Math.pow(10, decl.nfDb / 10) - 1) * rs, 0, 0, 0, 0, 0, 0, 0);
    } else {
      const f1 = (Math.pow(10, decl.fminDb / 10) - 1) / 2;
      const { rn, yoptRe: yr, yoptIm: yi } = decl;
      c = Float64Array.of(
        kt2 * rn, 0,
        kt2 * (f1 - rn * yr), kt2 * (rn * yi),
        kt2 * (f1 - rn * yr), -kt2 * (rn * yi),
        kt2 * rn * (yr * yr + yi * yi), 0,
      ); // prettier-ignore
    }
    units.push({ a, c });
  }
  const total: M2 = new Float64Array(8);
  const moved = new Float64Array(8);
  for (let k = units.length - 1; k >= 0; k--) {
    congruenceInto(units[k].a, total, moved, w.t, w.xh);
    const c = units[k].c;
    for (let s = 0; s < 8; s++) total[s] = c[s] + moved[s];
  }
  return { total, kt2, na };
}

/**
 * Noise figure (dB) of the whole chain at f0 by the correlation-matrix method. Passive stages
 * are taken at the chain's reference temperature, like the Friis cascade.
 */
export function correlationNoiseFigureDb(built: BuiltChain, atF0?: NodeAnalysis): number {
  const { total, kt2, na } = cascadeCorrelation(built, true, atF0);
  const zr = na.zsrcRe[0];
  const zi = na.zsrcIm[0];
  // [1 Zs]·C·[1 Zs]ᴴ = C11 + 2·Re(C12·Zs*) + C22·|Zs|²
  const excess = total[0] + 2 * (total[2] * zr + total[3] * zi) + total[6] * (zr * zr + zi * zi);
  return 10 * Math.log10(1 + excess / (kt2 * zr));
}

/** Noise parameters of a two-port, with Γopt against a stated reference resistance. */
export interface CascadeNoiseParameters {
  fHz: number;
  nfMinDb: number;
  gammaOpt: { re: number; im: number };
  rnOhm: number;
}

/**
 * Noise parameters (Fmin, Γopt against `z0`, Rn) at f0 of the two-ports between the source
 * and the load, read from their cascaded correlation matrix C = 2kT0·[[Rn, F1 − Rn·Yopt*],
 * [F1 − Rn·Yopt, Rn·|Yopt|²]] with F1 = (Fmin − 1)/2 (Hillbrand and Russer, 1976): Rn = C11/2kT0,
 * Bopt = Im C12 / C11, Gopt = √(C22/C11 − Bopt²), Fmin = 1 + (Re C12 + C11·Gopt)/kT0.
 * Null when the cascade has no noise voltage or no source admittance minimises its noise
 * (a noiseless chain, or one whose optimum source is not passive).
 */
export function cascadeNoiseParameters(
  built: BuiltChain,
  z0: number,
): CascadeNoiseParameters | null {
  const { total, kt2 } = cascadeCorrelation(built, false);
  const [c11, , c12re, c12im, , , c22] = total;
  if (!(c11 > 0) || !(z0 > 0)) return null;
  const bopt = c12im / c11;
  const g2 = c22 / c11 - bopt * bopt;
  if (!(g2 > 0)) return null;
  const gopt = Math.sqrt(g2);
  const fmin = 1 + (2 * (c12re + c11 * gopt)) / kt2;
  // Γ = (1 − z0·Y)/(1 + z0·Y)
  const nr = 1 - z0 * gopt;
  const ni = -z0 * bopt;
  const dr = 1 + z0 * gopt;
  const di = z0 * bopt;
  const den = dr * dr + di * di;
  const gamma = { re: (nr * dr + ni * di) / den, im: (ni * dr - nr * di) / den };
  const result = {
    fHz: built.settings.f0Hz,
    nfMinDb: 10 * Math.log10(fmin),
    gammaOpt: gamma,
    rnOhm: c11 / kt2,
  };
  const finite = [result.nfMinDb, gamma.re, gamma.im, result.rnOhm].every(Number.isFinite);
  return finite && fmin >= 1 ? result : null;
}
