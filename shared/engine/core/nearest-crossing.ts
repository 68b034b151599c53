/**
 * The rising zero crossing nearest a target frequency on a grid, found by scanning outward
 * from the target and evaluating only the points the scan passes.
 *
 * A search for one resonance near a known frequency used to evaluate the whole grid (4,001
 * points for an element's own resonance) and then pick the crossing nearest the target. The
 * outward scan takes the brackets in order of their distance from the target (in log
 * frequency) and stops once no bracket left can hold a nearer crossing, so it returns the
 * very bracket the whole-grid scan returns, ties included, usually after a few dozen points.
 */

const { abs, exp, log } = Math;
const isFiniteNumber = Number.isFinite;

/**
 * Rounding allowance on the distance bound: an interpolated crossing can lie an ulp outside
 * its bracket.
 */
const BOUND_SLACK = 1e-14;

/** Writes the value at grid point i into out[0] and the local frequency there into out[1]. */
export type GridValue = (i: number, out: Float64Array) => void;

/**
 * How far the bracket [a, b] lies from `target`, as a frequency ratio ≥ 1 (1 when it holds
 * the target): its log distance without taking a logarithm.
 */
function ratioOf(a: number, b: number, target: number): number {
  if (b < target) return target / b;
  if (a > target) return a / target;
  return 1;
}

/**
 * Index k of the rising zero crossing (s·v[k] < 0 ≤ s·v[k+1], s = +1 when the local
 * frequency rises from k to k+1, else −1) whose linearly interpolated frequency is nearest
 * `target` in log distance, the lowest such k on a tie; −1 when there is none. The same
 * answer as `nearestRisingCrossing` over the whole grid.
 * @param n grid points
 * @param freqAt the grid's (ascending) frequency at point i
 * @param valueAt the value and local frequency at point i (called at most once per point)
 * @param scratch two slots
 */
export function nearestRisingOutward(
  n: number,
  freqAt: (i: number) => number,
  valueAt: GridValue,
  target: number,
  scratch: Float64Array,
): number {
  if (n < 2) return -1;
  // The bracket holding the target (or the end nearer it), by bisection on the frequencies.
  let c = 0;
  let top = n - 2;
  while (c < top) {
    const mid = (c + top + 1) >> 1;
    if (freqAt(mid) <= target) c = mid;
    else top = mid - 1;
  }
  let bestK = -1;
  let bestD = Infinity;
  // A bracket farther than this ratio cannot hold a nearer crossing (exp of bestD + slack).
  let limit = Infinity;
  const consider = (k: number, vk: number, vk1: number, lk: number, lk1: number) => {
    const s = lk1 >= lk ? 1 : -1;
    const a = s * vk;
    const b = s * vk1;
    if (!(a < 0 && b >= 0) || !isFiniteNumber(a) || !isFiniteNumber(b)) return;
    const fk = freqAt(k);
    // As nearestRisingCrossing computes it (the fraction first, so the crossing stays in its
    // bracket even for subnormal values: the distance bound below relies on that).
    const fc = fk + (freqAt(k + 1) - fk) * (-a / (b - a));
    const d = abs(log(fc / target));
    if (d < bestD || (d === bestD && k < bestK)) {
      bestD = d;
      bestK = k;
      limit = exp(d + BOUND_SLACK);
    }
  };
  valueAt(c, scratch);
  let vDown = scratch[0]; // value and local frequency at point down + 1
  let lDown = scratch[1];
  valueAt(c + 1, scratch);
  let vUp = scratch[0]; // value and local frequency at point up
  let lUp = scratch[1];
  consider(c, vDown, vUp, lDown, lUp);
  let down = c - 1;
  let up = c + 1;
  // The next bracket on each side, its ends and its distance; a side that moves shares one
  // end with its next bracket, so each step asks for one new frequency.
  let fDownHi = down >= 0 ? freqAt(down + 1) : 0;
  let fDownLo = down >= 0 ? freqAt(down) : 0;
  let fUpLo = up <= n - 2 ? freqAt(up) : 0;
  let fUpHi = up <= n - 2 ? freqAt(up + 1) : 0;
  let bDown = down >= 0 ? ratioOf(fDownLo, fDownHi, target) : Infinity;
  let bUp = up <= n - 2 ? ratioOf(fUpLo, fUpHi, target) : Infinity;
  for (;;) {
    const next = bDown <= bUp ? bDown : bUp;
    if (next === Infinity || next > limit) return bestK;
    if (bDown <= bUp) {
      valueAt(down, scratch);
      consider(down, scratch[0], vDown, scratch[1], lDown);
      vDown = scratch[0];
      lDown = scratch[1];
      down--;
      if (down >= 0) {
        fDownHi = fDownLo;
        fDownLo = freqAt(down);
        bDown = ratioOf(fDownLo, fDownHi, target);
      } else bDown = Infinity;
    } else {
      valueAt(up + 1, scratch);
      consider(up, vUp, scratch[0], lUp, scratch[1]);
      vUp = scratch[0];
      lUp = scratch[1];
      up++;
      if (up <= n - 2) {
        fUpLo = fUpHi;
        fUpHi = freqAt(up + 1);
        bUp = ratioOf(fUpLo, fUpHi, target);
      } else bUp = Infinity;
    }
  }
}
