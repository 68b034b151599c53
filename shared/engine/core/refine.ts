/**
 * Locating what a grid only brackets: a zero of a function (resonances, band edges) and a
 * maximum (a response peak), by evaluating at single frequencies.
 *
 * Zeros: the Illinois variant of regula falsi (Dowell and Jarratt, BIT 11, 1971), which keeps
 * the bracket of bisection but converges superlinearly, so an edge known to 1e-6 of its
 * frequency costs a handful of evaluations instead of the 20-odd of bisection. Maxima: golden
 * section search (Kiefer, 1953) on a bracket of three grid points.
 */

/** Relative tolerance to which zeros and maxima are located (well inside 1e-6). */
export const REL_TOL = 1e-10;
const MAX_ITER = 100;
const INV_PHI = (Math.sqrt(5) - 1) / 2;

/**
 * A zero of g on [lo, hi] where g(lo) and g(hi) differ in sign (either order), to `tol`
 * relative to the frequency. `glo`/`ghi` may be passed when already known.
 */
export function solveBracketed(
  g: (f: number) => number,
  lo: number,
  hi: number,
  tol = REL_TOL,
  glo = g(lo),
  ghi = g(hi),
): number {
  if (glo === 0) return lo;
  if (ghi === 0) return hi;
  if (!(glo * ghi < 0)) return Number.NaN;
  let a = lo;
  let b = hi;
  let fa = glo;
  let fb = ghi;
  for (let it = 0; it < MAX_ITER && Math.abs(b - a) > tol * Math.abs(b); it++) {
    let c = b - (fb * (b - a)) / (fb - fa);
    // Keep c strictly inside; fall back to bisection when rounding puts it on an end.
    if (!(c > Math.min(a, b) && c < Math.max(a, b))) c = 0.5 * (a + b);
    const fc = g(c);
    if (fc === 0) return c;
    if (!Number.isFinite(fc)) return Number.NaN;
    if (fc * fb < 0) {
      a = b;
      fa = fb;
    } else {
      fa *= 0.5; // Illinois: the end kept twice counts half, so it is not kept forever
    }
    b = c;
    fb = fc;
  }
  return Math.abs(fb) < Math.abs(fa) ? b : a;
}

/**
 * The maximum of h on [lo, hi] (h unimodal there: a grid maximum and its two neighbours),
 * to `tol` relative. Returns [f, h(f)].
 */
export function maximise(
  h: (f: number) => number,
  lo: number,
  hi: number,
  tol = 1e-9,
): [number, number] {
  let a = lo;
  let b = hi;
  let c = b - INV_PHI * (b - a);
  let d = a + INV_PHI * (b - a);
  let hc = h(c);
  let hd = h(d);
  for (let it = 0; it < MAX_ITER && b - a > tol * Math.abs(b); it++) {
    if (hc >= hd) {
      b = d;
      d = c;
      hd = hc;
      c = b - INV_PHI * (b - a);
      hc = h(c);
    } else {
      a = c;
      c = d;
      hc = hd;
      d = a + INV_PHI * (b - a);
      hd = h(d);
    }
  }
  return hc >= hd ? [c, hc] : [d, hd];
}
