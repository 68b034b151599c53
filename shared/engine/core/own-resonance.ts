/**
 * A resonator's own (unloaded) resonance and Q: its element alone, searched near the loaded
 * resonance. The rising zero of the element's imaginary part nearest `near` on a log grid
 * from near/3 to 3·near (4,001 points), scanned outward from `near` so only the points up to
 * the crossing are evaluated (nearest-crossing.ts), then refined by the Illinois method
 * (refine.ts) from the grid values either side; Q = (ωr/2·real)·d(imag)/dω by central
 * difference.
 *
 * The scan's arrays live in one workspace kept by the module and reused by every search: a
 * search is called for each declared resonator of every analysis, and fresh arrays of the
 * whole grid each time were most of what an analysis allocated in typed arrays. A chunk's
 * values are valid when its stamp holds the current search's number, a grid point's growth
 * factor when it was computed for the current ratio, so nothing is cleared between searches.
 * Nothing a search calls can start another search.
 */
import type { ComplexFn } from '../types';
import { nearestRisingOutward } from './nearest-crossing';
import { solveBracketed } from './refine';

const { PI, exp, log } = Math;
const isFiniteNumber = Number.isFinite;

/** Grid points of the search for a resonator's own (unloaded) resonance. */
const OWN_POINTS = 4001;
/** Points of that grid whose values one block call gives (when the element has a block form). */
const OWN_CHUNK = 32;
const OWN_CHUNKS = Math.ceil(OWN_POINTS / OWN_CHUNK);
/** Relative step of the central difference for dB/dω. */
const DIFF_STEP = 1e-6;

/** Refines a bracketed rising zero of `g` on [lo, hi] by bisection to machine precision. */
export function bisectRising(g: (f: number) => number, lo: number, hi: number): number {
  if (g(hi) === 0) return hi;
  for (let it = 0; it < 200 && hi - lo > 4 * Number.EPSILON * hi; it++) {
    const mid = 0.5 * (lo + hi);
    const v = g(mid);
    if (v === 0) return mid;
    if (v < 0) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/** The reused arrays of the search (see the module's comment). */
interface OwnWorkspace {
  /** The grid's frequencies of the chunks a block call is given. */
  grid: Float64Array;
  /**
   * exp(ratio·i) of the grid's point i, and the ratio it was computed for: a grid point is
   * start·exp(ratio·i), and the ratio, log(9)/4000 up to rounding of the grid's ends, is the
   * same for almost every search, so each exponential is computed once, not once a search.
   */
  growth: Float64Array;
  growthRatio: Float64Array;
  /** The imaginary part at each grid point. */
  im: Float64Array;
  /**
   * The search number for which a chunk of im holds; numbers count up from 1 (a double:
   * exact far beyond any process's count of searches).
   */
  chunkStamp: Float64Array;
  /** A block call's (re, im) pairs. */
  pair: Float64Array;
  /** The point form's (re, im), and the scan's two slots. */
  out: Float64Array;
  scratch: Float64Array;
  search: number;
}

let workspace: OwnWorkspace | null = null;

function ownWorkspace(): OwnWorkspace {
  workspace ??= {
    grid: new Float64Array(OWN_POINTS),
    growth: new Float64Array(OWN_POINTS),
    growthRatio: new Float64Array(OWN_POINTS),
    im: new Float64Array(OWN_POINTS),
    chunkStamp: new Float64Array(OWN_CHUNKS),
    pair: new Float64Array(2 * OWN_CHUNK),
    out: new Float64Array(2),
    scratch: new Float64Array(2),
    search: 0,
  };
  workspace.search++;
  return workspace;
}

/**
 * Answers already found within one analysis, by element and target: the tanks of a coupled
 * pair are one element (the stage declares the same admittance for both) searched near the
 * same resonance, and an element is a function of frequency alone, so the second search
 * would repeat the first exactly. Kept per analysis (a study changes its elements).
 */
export type OwnResonanceMemo = Map<ComplexFn, { near: number; q: number | null }[]>;

/**
 * Q of a resonator's own element at its resonance nearest `near`, or null.
 * @param memo answers of this analysis so far: one found there is returned, a new one added
 */
export function ownResonance(fn: ComplexFn, near: number, memo?: OwnResonanceMemo): number | null {
  if (!memo) return searchOwnResonance(fn, near);
  let known = memo.get(fn);
  if (!known) memo.set(fn, (known = []));
  for (const k of known) if (k.near === near) return k.q;
  const q = searchOwnResonance(fn, near);
  known.push({ near, q });
  return q;
}

function searchOwnResonance(fn: ComplexFn, near: number): number | null {
  const ws = ownWorkspace();
  const { grid, growth, growthRatio, im, chunkStamp, pair, out, search } = ws;
  // The points of logGrid(near / 3, near * 3, OWN_POINTS), computed as it computes them.
  const start = near / 3;
  const stop = near * 3;
  const last = OWN_POINTS - 1;
  const ratio = log(stop / start) / last;
  const freqAt = (i: number) => {
    if (i === 0) return start;
    if (i === last) return stop;
    if (growthRatio[i] !== ratio) {
      growthRatio[i] = ratio;
      growth[i] = exp(ratio * i);
    }
    return start * growth[i];
  };
  const imAt = (f: number) => {
    fn(f, out, 0);
    return out[1];
  };
  // The scan's values: with a block form, a chunk of OWN_CHUNK points at a time (their
  // frequencies, then one block call), the same numbers as the point form.
  const block = fn.fill;
  const imOf = (i: number) => {
    if (!block) return (im[i] = imAt(freqAt(i)));
    const c = (i / OWN_CHUNK) | 0;
    if (chunkStamp[c] !== search) {
      const from = c * OWN_CHUNK;
      const n = Math.min(OWN_CHUNK, OWN_POINTS - from);
      for (let j = from; j < from + n; j++) grid[j] = freqAt(j);
      block(grid, from, n, pair, 0, 2);
      for (let j = 0; j < n; j++) im[from + j] = pair[2 * j + 1];
      chunkStamp[c] = search;
    }
    return im[i];
  };
  const k = nearestRisingOutward(
    OWN_POINTS,
    freqAt,
    (i, v) => {
      v[0] = imOf(i);
      v[1] = freqAt(i); // the element's own frequency is the grid's: always rising
    },
    near,
    ws.scratch,
  );
  if (k < 0) return null;
  // The scan evaluated both ends of the bracket: the refinement starts from their values.
  const fr = solveBracketed(imAt, freqAt(k), freqAt(k + 1), undefined, im[k], im[k + 1]);
  if (!isFiniteNumber(fr)) return null;
  fn(fr, out, 0);
  const real = out[0];
  const h = fr * DIFF_STEP;
  const slope = (imAt(fr + h) - imAt(fr - h)) / (2 * PI * 2 * h);
  const q = ((2 * PI * fr) / (2 * real)) * slope;
  return isFiniteNumber(q) && q > 0 ? q : null;
}
