/**
 * Resonances measured through a probed quantity over a grid: the machinery behind the
 * declared resonators whose Q is not the plain node admittance's (a series resonator's loop
 * impedance, one tank of a coupled pair) and behind unloaded Q.
 *
 * The probed quantity at grid point i is written as (real part, imaginary part, the node's own
 * frequency); its resonance is the rising zero of the imaginary part nearest the target,
 * bracketed on the grid and refined by bisection with single-frequency evaluations; Q =
 * (ωr/2·real)·d(imag)/dω by central difference.
 */
import type { ComplexFn } from '../types';
import type { BuiltChain } from './build';
import { impedanceRow, type NodeAnalysis } from './nodes';
import type { Probe } from './probe';
import { nearestRisingOutward } from './nearest-crossing';
import { solveBracketed } from './refine';

export { bisectRising, ownResonance, type OwnResonanceMemo } from './own-resonance';

// Globals read once: a global lookup inside a hot loop is slow in some hosts (test VMs).
const { PI, abs, log } = Math;
const isFiniteNumber = Number.isFinite;

/** Relative step of the central difference for dB/dω. */
export const DIFF_STEP = 1e-6;

/** Writes (real part, imaginary part, local frequency) of the probed quantity at point i. */
export type Extract = (na: NodeAnalysis, i: number, out: Float64Array) => void;

/**
 * Index k of the rising zero crossing (v[k] < 0 ≤ v[k+1]) whose interpolated frequency is
 * nearest `target`, or −1 when there is none. With `local` (the node's own frequency at each
 * point, which falls as the input rises behind a mixer whose LO is above the signal), "rising"
 * means rising with the local frequency.
 */
export function nearestRisingCrossing(
  f: ArrayLike<number>,
  v: ArrayLike<number>,
  target: number,
  local?: ArrayLike<number>,
): number {
  let best = -1;
  let bestDist = Infinity;
  for (let k = 0; k + 1 < f.length; k++) {
    const s = orientation(local, k);
    const a = s * v[k];
    const b = s * v[k + 1];
    if (!(a < 0 && b >= 0) || !isFiniteNumber(a) || !isFiniteNumber(b)) continue;
    // The fraction first: it lies in [0, 1] even for subnormal values, whose product with the
    // step could round to a point far outside the bracket.
    const fc = f[k] + (f[k + 1] - f[k]) * (-a / (b - a));
    const d = abs(log(fc / target));
    if (d < bestDist) {
      bestDist = d;
      best = k;
    }
  }
  return best;
}

/** +1 when the local frequency rises from point k to k+1 (or none is given), else −1. */
function orientation(local: ArrayLike<number> | undefined, k: number): number {
  return !local || local[k + 1] >= local[k] ? 1 : -1;
}

export interface Resonance {
  fIn: number;
  fr: number;
  real: number;
  q: number;
}

/**
 * Finds the resonance of one probed quantity nearest `target` (input Hz) and its Q. The grid
 * is scanned outward from the target (nearest-crossing.ts): the bracket is the one a scan of
 * the whole grid picks, and only the points up to it are probed. The bracket is then refined
 * with `evalAt` (a probe evaluated for the node the Extract reads: probePointEval).
 */
export function resonate(
  evalAt: PointEval,
  grid: Float64Array,
  gridNa: NodeAnalysis,
  extract: Extract,
  target: number,
  onGrid?: GridQuantity,
): Resonance | null {
  const out = new Float64Array(3);
  const valueAt = (i: number, v: Float64Array) => {
    extract(gridNa, i, out);
    v[0] = out[1];
    v[1] = out[2];
  };
  const k = onGrid
    ? nearestRisingCrossing(grid, onGrid.imag, target, onGrid.local)
    : nearestRisingOutward(grid.length, (i) => grid[i], valueAt, target, new Float64Array(2));
  if (k < 0) return null;
  extract(gridNa, k, out);
  const localK = out[2];
  extract(gridNa, k + 1, out);
  const sign = out[2] >= localK ? 1 : -1;
  return refineResonance(evalAt, extract, grid[k], grid[k + 1], sign);
}

/** The chain at one input frequency, as a node analysis whose point 0 an Extract reads. */
export type PointEval = (f: number) => NodeAnalysis;

/**
 * A PointEval by a probe evaluated for `node` (probe.ts): cheaper than a node analysis, it
 * fills Zsrc at nodes 0…node and Zin from there up to the first amplifier. Enough for an
 * Extract that reads those only (coupledExtract at `node`, seriesExtract of section node−1).
 */
export function probePointEval(probe: Probe, node: number): PointEval {
  const { fNode, zinRe, zinIm, zsrcRe, zsrcIm } = probe;
  const view = { points: 1, nodes: probe.nodes, fNode, zinRe, zinIm, zsrcRe, zsrcIm };
  return (f) => {
    probe.at(f, node);
    return view as NodeAnalysis;
  };
}

/**
 * The resonance of a probed quantity on a bracket [lo, hi] (input Hz) where sign × its
 * imaginary part rises through zero, located to 1e-10 relative (Illinois, refine.ts: a
 * handful of single-frequency evaluations where bisection to machine precision took ~50),
 * and its Q.
 */
export function refineResonance(
  evalAt: PointEval,
  extract: Extract,
  lo: number,
  hi: number,
  sign: number,
): Resonance | null {
  const out = new Float64Array(3);
  const g = (f: number) => {
    extract(evalAt(f), 0, out);
    return sign * out[1];
  };
  const fIn = solveBracketed(g, lo, hi);
  if (!isFiniteNumber(fIn)) return null;
  g(fIn);
  const real = out[0];
  const fr = out[2];
  extract(evalAt(fIn * (1 - DIFF_STEP)), 0, out);
  const imLo = out[1];
  const fLo = out[2];
  extract(evalAt(fIn * (1 + DIFF_STEP)), 0, out);
  const slope = (out[1] - imLo) / (2 * PI * (out[2] - fLo)); // d(im)/dω at the node
  const q = ((2 * PI * fr) / (2 * real)) * slope;
  return { fIn, fr, real, q: isFiniteNumber(q) && q > 0 ? q : NaN };
}

/**
 * The rising zero of a probed quantity nearest `near` (input Hz) without a grid: steps
 * outward geometrically up to a factor `span` each way until sign × its imaginary part
 * changes sign, then refines as {@link refineResonance}. What a study uses to follow a
 * resonance it already knows from the nominal chain.
 */
export function resonateNear(
  evalAt: PointEval,
  extract: Extract,
  near: number,
  sign: number,
  span = 2,
): Resonance | null {
  const out = new Float64Array(3);
  const g = (f: number) => {
    extract(evalAt(f), 0, out);
    return sign * out[1];
  };
  const g0 = g(near);
  if (!isFiniteNumber(g0)) return null;
  const up = g0 < 0; // below the zero the quantity is negative: look upward
  let prev = near;
  for (let step = 1e-4; ; step *= 2) {
    const ratio = 1 + Math.min(step, span - 1);
    const f = up ? near * ratio : near / ratio;
    const v = g(f);
    if (isFiniteNumber(v) && (up ? v >= 0 : v < 0)) {
      return up
        ? refineResonance(evalAt, extract, prev, f, sign)
        : refineResonance(evalAt, extract, f, prev, sign);
    }
    if (!isFiniteNumber(v) || ratio >= span) return null;
    prev = f;
  }
}

function addInverse(re: number, im: number, out: Float64Array, o: number): void {
  if (!isFiniteNumber(re) || !isFiniteNumber(im)) return; // an open side adds nothing
  const d = re * re + im * im;
  out[o] += d === 0 ? Infinity : re / d;
  out[o + 1] += d === 0 ? 0 : -im / d;
}

export function shuntExtract(node: number, downstream: boolean): Extract {
  return (na, i, out) => {
    const k = impedanceRow(na, node) * na.points + i;
    out[0] = 0;
    out[1] = 0;
    addInverse(na.zsrcRe[k], na.zsrcIm[k], out, 0);
    if (downstream) addInverse(na.zinRe[k], na.zinIm[k], out, 0);
    out[2] = na.fNode[k];
  };
}

/**
 * One tank of a coupled pair, probed at the stage boundary on the tank's far side from its
 * partner (electrically the tank's own node): real part = the conductance there (source,
 * and downstream when `downstream`; `ownToo` adds the tank's own when the probed side does
 * not already hold it), imaginary part = the tank's OWN susceptance, so Q = (ωr/2G)·dB/dω
 * uses the energy the tank itself stores, not the pair's split response.
 */
export function coupledExtract(
  node: number,
  own: ComplexFn,
  withSource: boolean,
  downstream: boolean,
  ownToo: boolean,
): Extract {
  const y = new Float64Array(2);
  return (na, i, out) => {
    const k = impedanceRow(na, node) * na.points + i;
    out[0] = 0;
    out[1] = 0;
    if (withSource) addInverse(na.zsrcRe[k], na.zsrcIm[k], out, 0);
    if (downstream) addInverse(na.zinRe[k], na.zinIm[k], out, 0);
    const f = na.fNode[k];
    own(f, y, 0);
    if (ownToo) out[0] += y[0];
    out[1] = y[1];
    out[2] = f;
  };
}

/** The imaginary part of a probed quantity over a whole grid, with the local frequency. */
export interface GridQuantity {
  imag: Float64Array;
  local: Float64Array;
}

/**
 * The loop reactance through section `section` over the grid read from the node analysis
 * alone, when the section is one series element (A = D = 1, C = 0 at its design frequency):
 * the backward pass then gives Zin at its input as Zin at its output plus its own impedance,
 * so Zsrc + Zin at its input is the loop (seriesExtract's quantity, to rounding). A scan of
 * this array (no section evaluated) finds the bracket a scan of the extract finds; null for
 * any other section.
 */
export function seriesLoopOnGrid(
  built: BuiltChain,
  section: number,
  na: NodeAnalysis,
): GridQuantity | null {
  const m = new Float64Array(8);
  built.sections[section].abcd(built.f0AtFlatNode[section], m, 0);
  const series = m[0] === 1 && m[1] === 0 && m[4] === 0 && m[5] === 0 && m[6] === 1 && m[7] === 0; // prettier-ignore
  if (!series) return null;
  const P = na.points;
  const base = impedanceRow(na, section) * P;
  const imag = new Float64Array(P);
  for (let i = 0; i < P; i++) imag[i] = na.zsrcIm[base + i] + na.zinIm[base + i];
  return { imag, local: na.fNode.subarray(base, base + P) };
}

/** Points of a grid whose section matrices a series extract fills at once (block form). */
const SERIES_CHUNK = 64;

/**
 * The loop impedance through a series section (flat index `section`): Zsrc at its input +
 * its own series impedance (B) + Zin at its output; imaginary part = the loop reactance.
 * On a grid (more than one point) the section's matrices are written by its block form,
 * SERIES_CHUNK points at a time where the scan first needs them: a scan that finds no
 * crossing reads every point, and one block call costs what a few point calls do.
 */
export function seriesExtract(built: BuiltChain, section: number): Extract {
  const sec = built.sections[section];
  const m = new Float64Array(8);
  let grid: NodeAnalysis | null = null;
  let gm = new Float64Array(0);
  let filled = new Uint8Array(0);
  return (na, i, out) => {
    const kIn = impedanceRow(na, section) * na.points + i;
    const kOut = impedanceRow(na, section + 1) * na.points + i;
    let mm = m;
    let o = 0;
    if (na.points === 1) sec.abcd(na.fNode[kIn], m, 0);
    else {
      if (na !== grid) {
        grid = na;
        gm = new Float64Array(8 * na.points);
        filled = new Uint8Array(Math.ceil(na.points / SERIES_CHUNK));
      }
      const c = (i / SERIES_CHUNK) | 0;
      if (!filled[c]) {
        const from = c * SERIES_CHUNK;
        const n = Math.min(SERIES_CHUNK, na.points - from);
        sec.fill(na.fNode, impedanceRow(na, section) * na.points + from, n, gm, 8 * from);
        filled[c] = 1;
      }
      mm = gm;
      o = 8 * i;
    }
    out[0] = na.zsrcRe[kIn] + mm[o + 2] + na.zinRe[kOut];
    out[1] = na.zsrcIm[kIn] + mm[o + 3] + na.zinIm[kOut];
    out[2] = na.fNode[kIn];
  };
}
