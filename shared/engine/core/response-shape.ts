/**
 * The shape of the response |V[n]|/|Es| at one node: its peak and its band edges, bracketed
 * on a grid (a sweep) and then located by evaluating the chain at single frequencies, so the
 * figures do not depend on the grid's spacing.
 *
 * The grid is scanned as the power ratio |V|²/|Es|² (products only): a logarithm and a
 * magnitude per point cost more than the node analysis that gave the point. Only the grid
 * points a search starts from are put in dB, by the same formula as before; a point within
 * rounding of a level is judged in dB, so the scan picks the brackets the dB grid picked.
 */
import { voltageRow, type NodeAnalysis } from './nodes';
import type { Probe } from './probe';
import { stepUp } from './quantities';
import { maximiseSmooth, solveBracketed } from './refine';

const { log10 } = Math;
const isFiniteNumber = Number.isFinite;
/** Relative margin of the power scan's comparisons: beyond it rounding cannot matter. */
const SCAN_MARGIN = 1e-9;
/**
 * Brent's tolerance for a peak: it stops with the maximum known to within 2·tol of its
 * frequency, so peaks are located to 1e-8 relative. A maximum is flat to second order, so
 * its level is then known to rounding, and closer than about √ε ≈ 1.5e-8 its frequency is
 * decided by rounding anyway: further steps would be paid for and tell nothing.
 */
const PEAK_TOL = 0.5e-8;

export const toDb = (r: number) => 20 * log10(r);

/** A located peak: the grid index it was bracketed at, its frequency and level (dB). */
export interface Peak {
  k: number;
  fHz: number;
  db: number;
}

/** Step-up in dB at `flat` for input frequency f, from the probe. */
export function dbAt(probe: Probe, flat: number, f: number): number {
  return toDb(probe.at(f, flat, true));
}

/** The step-up at grid point i of `na` at `flat`, dB. */
export function gridDb(na: NodeAnalysis, flat: number, i: number): number {
  return toDb(stepUp(na, flat, i));
}

/** |V|²/|Es|² at `flat` at every grid point of `na`, into out (length ≥ points). */
export function stepUpPower(na: NodeAnalysis, flat: number, out: Float64Array): void {
  const { points: P, vRe, vIm, emf } = na;
  const base = voltageRow(na, flat) * P;
  for (let i = 0; i < P; i++) {
    const vr = vRe[base + i];
    const vi = vIm[base + i];
    const e = emf[i];
    out[i] = (vr * vr + vi * vi) / (e * e);
  }
}

/**
 * What one pass over a node's grid learns for its selectivity: the power ratios (into the
 * array given), the grid peak {@link powerMax} picks, and the lowest power either side of it,
 * which answers {@link mayFall} for any level without another pass.
 */
export interface PowerScan {
  /** Index of the highest finite, positive power ratio, or −1 (powerMax's). */
  k: number;
  /** The lowest power ratio below k and above k (NaN ignored; Infinity when none). */
  minBelow: number;
  minAbove: number;
}

/**
 * |V|²/|Es|² at `flat` at every grid point of `na` into out (stepUpPower's numbers), with its
 * peak and the lowest ratio either side of the peak found in the same pass.
 */
export function scanStepUpPower(
  na: NodeAnalysis,
  flat: number,
  out: Float64Array,
  scan: PowerScan,
): void {
  const { points: P, vRe, vIm, emf } = na;
  const base = voltageRow(na, flat) * P;
  let k = -1;
  let best = 0;
  let runMin = Infinity; // over the points before i
  let minBelow = Infinity;
  let minAbove = Infinity;
  for (let i = 0; i < P; i++) {
    const vr = vRe[base + i];
    const vi = vIm[base + i];
    const e = emf[i];
    const p = (vr * vr + vi * vi) / (e * e);
    out[i] = p;
    if (p > 0 && p < Infinity && (k < 0 || p > best)) {
      k = i;
      best = p;
      minBelow = runMin;
      minAbove = Infinity;
    } else if (p < minAbove) minAbove = p;
    if (p < runMin) runMin = p;
  }
  scan.k = k;
  scan.minBelow = minBelow;
  scan.minAbove = minAbove;
}

/** {@link mayFall}'s answer from a scan: whether the grid comes near `level` on that side. */
export function mayFallScanned(scan: PowerScan, level: number, dir: -1 | 1): boolean {
  const surelyNot = 10 ** (level / 10) * (1 + SCAN_MARGIN);
  return (dir < 0 ? scan.minBelow : scan.minAbove) <= surelyNot;
}

/** Index of the highest finite, positive power ratio of the first `n`, or −1 (gridMax's). */
export function powerMax(power: ArrayLike<number>, n: number): number {
  let k = -1;
  for (let i = 0; i < n; i++) {
    const p = power[i];
    if (p > 0 && p < Infinity && (k < 0 || p > power[k])) k = i;
  }
  return k;
}

/** Index of the highest finite value, or −1. */
export function gridMax(db: ArrayLike<number>): number {
  let k = -1;
  for (let i = 0; i < db.length; i++) if (isFiniteNumber(db[i]) && (k < 0 || db[i] > db[k])) k = i;
  return k;
}

/**
 * The peak bracketed by grid point k and its neighbours, located to 1e-8 relative (PEAK_TOL)
 * by Brent's method from grid point k (refine.ts), its first step the parabola through the three grid points when their
 * levels are given (`dbLo`, `dbHi`: the grid's at k − 1 and k + 1). A peak on the first or
 * last grid point stays there (it lies at or beyond the grid's end).
 */
export function locatePeak(
  probe: Probe,
  flat: number,
  f: ArrayLike<number>,
  dbK: number,
  k: number,
  dbLo?: number,
  dbHi?: number,
): Peak {
  const last = f.length - 1;
  if (k <= 0 || k >= last) return { k, fHz: f[k], db: dbK };
  const known =
    dbLo !== undefined && dbHi !== undefined ? { hLo: dbLo, hStart: dbK, hHi: dbHi } : undefined;
  const [fHz, level] = maximiseSmooth((x) => dbAt(probe, flat, x), f[k - 1], f[k + 1], f[k], PEAK_TOL, known); // prettier-ignore
  // The search cannot do worse than the grid point it started from.
  return level >= dbK ? { k, fHz, db: level } : { k, fHz: f[k], db: dbK };
}

/** The peak at grid point k of `na` at `flat`, its neighbours' levels read from the grid. */
export function locateGridPeak(probe: Probe, na: NodeAnalysis, flat: number, k: number): Peak {
  const inside = k > 0 && k < na.points - 1;
  const dbK = gridDb(na, flat, k);
  if (!inside) return locatePeak(probe, flat, na.freqs, dbK, k);
  return locatePeak(probe, flat, na.freqs, dbK, k, gridDb(na, flat, k - 1), gridDb(na, flat, k + 1)); // prettier-ignore
}

/** One side's edge at `level`: its frequency and the grid index beyond it (or null). */
export interface Edge {
  fHz: number;
  /** Grid index of the first point past the edge (below the level). */
  beyond: number;
}

/**
 * Whether the grid's response on one side of grid point p (dir −1 below, +1 above) comes
 * near enough to `level` for {@link locateEdge} to find an edge there: without such a point
 * it finds none, so one plain pass over the powers spares it its scan.
 */
export function mayFall(power: Float64Array, p: number, level: number, dir: -1 | 1): boolean {
  const surelyNot = 10 ** (level / 10) * (1 + SCAN_MARGIN);
  const end = dir < 0 ? -1 : power.length;
  for (let k = p + dir; k !== end; k += dir) if (power[k] <= surelyNot) return true;
  return false;
}

/**
 * The edge where the response first falls below `level` walking from the peak at grid point
 * p toward lower (dir −1) or higher (dir +1) frequencies, located to 1e-10 relative.
 * @param power the grid's power ratios at `flat` (stepUpPower)
 */
export function locateEdge(
  probe: Probe,
  flat: number,
  na: NodeAnalysis,
  power: ArrayLike<number>,
  p: number,
  level: number,
  dir: -1 | 1,
): Edge | null {
  const f = na.freqs;
  const threshold = 10 ** (level / 10);
  const surelyBelow = threshold * (1 - SCAN_MARGIN);
  const surelyNot = threshold * (1 + SCAN_MARGIN);
  for (let k = p; k + dir >= 0 && k + dir < na.points; k += dir) {
    const next = k + dir;
    const q = power[next];
    if (!(q < surelyBelow) && (q > surelyNot || !(gridDb(na, flat, next) < level))) continue;
    const g = (x: number) => dbAt(probe, flat, x) - level;
    const dbK = gridDb(na, flat, k) - level;
    const dbNext = gridDb(na, flat, next) - level;
    const fHz =
      dir < 0
        ? solveBracketed(g, f[next], f[k], undefined, dbNext, dbK)
        : solveBracketed(g, f[k], f[next], undefined, dbK, dbNext);
    return isFiniteNumber(fHz) ? { fHz, beyond: next } : null;
  }
  return null;
}

/** The "−3 dB" level below a peak: the half-power points, 10·log10(2) dB down. */
export const HALF_POWER_DB = 10 * log10(2);

/**
 * A node's response over a grid as far as its half-power edges: the scan's power ratios and
 * what the scan learnt, the located peak (null when no grid point has a finite, positive
 * power) and the edges half a power below it either side.
 */
export interface HalfPowerShape {
  power: Float64Array;
  scan: PowerScan;
  peak: Peak | null;
  lo: Edge | null;
  hi: Edge | null;
}

/**
 * The shapes found over one node analysis's grid, by flat node: a coupled pair's peak and
 * width and the selectivity at its output node are the same searches, so the second reads
 * the first's (valid for the one analysis that made them).
 */
export type ShapeMemo = Map<number, HalfPowerShape>;

/** Scans `flat` over the grid of `na`, locates its peak and its half-power edges. */
export function halfPowerShape(probe: Probe, na: NodeAnalysis, flat: number): HalfPowerShape {
  const power = new Float64Array(na.points);
  const scan: PowerScan = { k: -1, minBelow: Infinity, minAbove: Infinity };
  scanStepUpPower(na, flat, power, scan);
  const k = scan.k;
  if (k < 0) return { power, scan, peak: null, lo: null, hi: null };
  const peak = locateGridPeak(probe, na, flat, k);
  const level = peak.db - HALF_POWER_DB;
  const lo = locateEdge(probe, flat, na, power, k, level, -1);
  const hi = locateEdge(probe, flat, na, power, k, level, 1);
  return { power, scan, peak, lo, hi };
}
