/**
 * A resonator's own (unloaded) resonance and Q: its element alone, searched near the loaded
 * resonance. The rising zero of the element's imaginary part nearest `near` on a log grid
 * from near/3 to 3·near (4,001 points), scanned outward from `near` so only the points up to
 * the crossing are evaluated (nearest-crossing.ts), then bisected to machine precision; Q =
 * (ωr/2·real)·d(imag)/dω by central difference.
 */
import type { ComplexFn } from '../types';
import { nearestRisingOutward } from './nearest-crossing';

const { PI, exp, log } = Math;
const isFiniteNumber = Number.isFinite;

/** Grid points of the search for a resonator's own (unloaded) resonance. */
const OWN_POINTS = 4001;
/** Points of that grid whose values one block call gives (when the element has a block form). */
const OWN_CHUNK = 32;
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

/** Q of a resonator's own element at its resonance nearest `near`, or null. */
export function ownResonance(fn: ComplexFn, near: number): number | null {
  // The points of logGrid(near / 3, near * 3, OWN_POINTS), computed as it computes them.
  const start = near / 3;
  const stop = near * 3;
  const last = OWN_POINTS - 1;
  const ratio = log(stop / start) / last;
  // Each point's frequency computed once (an exponential), when the scan first reaches it.
  const grid = new Float64Array(OWN_POINTS);
  const freqAt = (i: number) => {
    const f = grid[i];
    if (f !== 0) return f;
    return (grid[i] = i === 0 ? start : i === last ? stop : start * exp(ratio * i));
  };
  const out = new Float64Array(2);
  const imAt = (f: number) => {
    fn(f, out, 0);
    return out[1];
  };
  // The scan's values: with a block form, a chunk of OWN_CHUNK points at a time (their
  // frequencies, then one block call), the same numbers as the point form.
  const block = fn.fill;
  const im = new Float64Array(OWN_POINTS);
  const done = new Uint8Array(Math.ceil(OWN_POINTS / OWN_CHUNK));
  const pair = new Float64Array(2 * OWN_CHUNK);
  const imOf = (i: number) => {
    if (!block) return imAt(freqAt(i));
    const c = (i / OWN_CHUNK) | 0;
    if (!done[c]) {
      const from = c * OWN_CHUNK;
      const n = Math.min(OWN_CHUNK, OWN_POINTS - from);
      for (let j = from; j < from + n; j++) freqAt(j);
      block(grid, from, n, pair, 0, 2);
      for (let j = 0; j < n; j++) im[from + j] = pair[2 * j + 1];
      done[c] = 1;
    }
    return im[i];
  };
  const scratch = new Float64Array(2);
  const k = nearestRisingOutward(
    OWN_POINTS,
    freqAt,
    (i, v) => {
      v[0] = imOf(i);
      v[1] = freqAt(i); // the element's own frequency is the grid's: always rising
    },
    near,
    scratch,
  );
  if (k < 0) return null;
  const fr = bisectRising(imAt, freqAt(k), freqAt(k + 1));
  fn(fr, out, 0);
  const real = out[0];
  const h = fr * DIFF_STEP;
  const slope = (imAt(fr + h) - imAt(fr - h)) / (2 * PI * 2 * h);
  const q = ((2 * PI * fr) / (2 * real)) * slope;
  return isFiniteNumber(q) && q > 0 ? q : null;
}
