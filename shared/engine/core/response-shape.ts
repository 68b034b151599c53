/**
 * The shape of the response |V[n]|/|Es| at one node: its peak and its band edges, bracketed
 * on a grid (a sweep) and then located by evaluating the chain at single frequencies, so the
 * figures do not depend on the grid's spacing.
 */
import type { Probe } from './probe';
import { maximise, solveBracketed } from './refine';

const { log10 } = Math;
const isFiniteNumber = Number.isFinite;

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

/** Index of the highest finite value, or −1. */
export function gridMax(db: ArrayLike<number>): number {
  let k = -1;
  for (let i = 0; i < db.length; i++) if (isFiniteNumber(db[i]) && (k < 0 || db[i] > db[k])) k = i;
  return k;
}

/**
 * The peak bracketed by grid point k and its neighbours, located by golden-section search. A
 * peak on the first or last grid point stays there (it lies at or beyond the grid's end).
 */
export function locatePeak(
  probe: Probe,
  flat: number,
  f: ArrayLike<number>,
  db: ArrayLike<number>,
  k: number,
): Peak {
  const last = f.length - 1;
  if (k <= 0 || k >= last) return { k, fHz: f[k], db: db[k] };
  const [fHz, level] = maximise((x) => dbAt(probe, flat, x), f[k - 1], f[k + 1]);
  // The search cannot do worse than the grid point it started from.
  return level >= db[k] ? { k, fHz, db: level } : { k, fHz: f[k], db: db[k] };
}

/** One side's edge at `level`: its frequency and the grid index beyond it (or null). */
export interface Edge {
  fHz: number;
  /** Grid index of the first point past the edge (below the level). */
  beyond: number;
}

/**
 * The edge where the response first falls below `level` walking from the peak at grid point
 * p toward lower (dir −1) or higher (dir +1) frequencies, located to 1e-10 relative.
 */
export function locateEdge(
  probe: Probe,
  flat: number,
  f: ArrayLike<number>,
  db: ArrayLike<number>,
  p: number,
  level: number,
  dir: -1 | 1,
): Edge | null {
  for (let k = p; k + dir >= 0 && k + dir < f.length; k += dir) {
    const next = k + dir;
    if (!(db[next] < level)) continue;
    const g = (x: number) => dbAt(probe, flat, x) - level;
    const [lo, hi, glo, ghi] =
      dir < 0 ? [f[next], f[k], db[next] - level, db[k] - level] : [f[k], f[next], db[k] - level, db[next] - level]; // prettier-ignore
    const fHz = solveBracketed(g, lo, hi, undefined, glo, ghi);
    return isFiniteNumber(fHz) ? { fHz, beyond: next } : null;
  }
  return null;
}
