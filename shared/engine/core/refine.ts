/**
 * Locating what a grid only brackets: a zero of a function (resonances, band edges) and a
 * maximum (a response peak), by evaluating at single frequencies.
 *
 * Zeros: the Illinois variant of regula falsi (Dowell and Jarratt, BIT 11, 1971), which keeps
 * the bracket of bisection but converges superlinearly, so an edge known to 1e-6 of its
 * frequency costs a handful of evaluations instead of the 20-odd of bisection. Maxima: golden
 * section search (Kiefer, 1953) on a bracket of three grid points, or Brent's method where
 * the function is smooth there.
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

/** 1 − 1/φ: the golden section's step as a share of the bracket. */
const GOLDEN_STEP = (3 - Math.sqrt(5)) / 2;

/** What is already known of h at a bracket's ends and its start (a grid's values). */
export interface KnownPeak {
  hLo: number;
  hStart: number;
  hHi: number;
}

/**
 * The maximum of h on [lo, hi] (h unimodal and smooth there: a response peak and the grid
 * points either side), to `tol` relative, starting from `start` inside the bracket. Brent's
 * method (R. P. Brent, Algorithms for Minimization without Derivatives, 1973, ch. 5):
 * parabolic interpolation through the best three points so far, with a golden-section step
 * whenever the parabola's step is not trusted; no step is shorter than the tolerance, so
 * rounding at the top of a flat peak cannot stall it. A smooth peak costs about a third of
 * golden section's evaluations. With `known` values of h at lo, start and hi (a grid point
 * and its neighbours) the first step is the parabola through those three instead of a
 * golden-section step, and no evaluation repeats them. Returns [f, h(f)].
 */
export function maximiseSmooth(
  h: (f: number) => number,
  lo: number,
  hi: number,
  start = lo + GOLDEN_STEP * (hi - lo),
  tol = 1e-9,
  known?: KnownPeak,
): [number, number] {
  const { abs } = Math;
  let a = lo;
  let b = hi;
  const seeded =
    known !== undefined &&
    Number.isFinite(known.hLo) &&
    Number.isFinite(known.hStart) &&
    Number.isFinite(known.hHi);
  // Minimises −h; x is the best point, w the second best, v the previous w.
  let x = start;
  let fx = seeded ? -known.hStart : -h(x);
  let w = x;
  let fw = fx;
  let v = x;
  let fv = fx;
  let d = 0;
  let e = 0; // the step before last
  if (seeded) {
    // The bracket's ends as the other two points, and a step before last as wide as the
    // bracket, so the first parabola is trusted when it stays well inside.
    const loBetter = known.hLo >= known.hHi;
    w = loBetter ? lo : hi;
    fw = -(loBetter ? known.hLo : known.hHi);
    v = loBetter ? hi : lo;
    fv = -(loBetter ? known.hHi : known.hLo);
    e = hi - lo;
  }
  for (let it = 0; it < MAX_ITER; it++) {
    const m = 0.5 * (a + b);
    const tol1 = tol * abs(x);
    const tol2 = 2 * tol1;
    if (abs(x - m) <= tol2 - 0.5 * (b - a)) break;
    let golden = true;
    if (abs(e) > tol1) {
      const r = (x - w) * (fx - fv);
      let q = (x - v) * (fx - fw);
      let p = (x - v) * q - (x - w) * r;
      q = 2 * (q - r);
      if (q > 0) p = -p;
      else q = -q;
      const before = e;
      e = d;
      // Trust the parabola when it moves less than half the step before last, inside (a, b).
      if (abs(p) < abs(0.5 * q * before) && p > q * (a - x) && p < q * (b - x)) {
        d = p / q;
        const u = x + d;
        if (u - a < tol2 || b - u < tol2) d = x < m ? tol1 : -tol1;
        golden = false;
      }
    }
    if (golden) {
      e = (x < m ? b : a) - x;
      d = GOLDEN_STEP * e;
    }
    const u = abs(d) >= tol1 ? x + d : x + (d > 0 ? tol1 : -tol1);
    const fu = -h(u);
    if (fu <= fx) {
      if (u < x) b = x;
      else a = x;
      v = w;
      fv = fw;
      w = x;
      fw = fx;
      x = u;
      fx = fu;
    } else {
      if (u < x) a = u;
      else b = u;
      if (fu <= fw || w === x) {
        v = w;
        fv = fw;
        w = u;
        fw = fu;
      } else if (fu <= fv || v === x || v === w) {
        v = u;
        fv = fu;
      }
    }
  }
  return [x, -fx];
}
