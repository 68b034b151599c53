/**
 * Allocation-free complex arithmetic on (re, im) pairs.
 *
 * A result is written into `out[o]` (real part) and `out[o + 1]` (imaginary part) so hot
 * loops can keep everything in Float64Arrays. Every helper reads all its inputs before it
 * writes, so `out` may alias an input slot.
 */

/** Writes (ar + j·ai)·(br + j·bi) into out[o], out[o+1]. */
export function cmul(
  ar: number,
  ai: number,
  br: number,
  bi: number,
  out: Float64Array,
  o: number,
): void {
  const re = ar * br - ai * bi;
  const im = ar * bi + ai * br;
  out[o] = re;
  out[o + 1] = im;
}

/**
 * Writes (ar + j·ai)/(br + j·bi) into out[o], out[o+1], with Smith's scaling so that large
 * or small denominators do not overflow. Division by zero gives non-finite parts.
 */
export function cdiv(
  ar: number,
  ai: number,
  br: number,
  bi: number,
  out: Float64Array,
  o: number,
): void {
  let re: number;
  let im: number;
  if (Math.abs(br) >= Math.abs(bi)) {
    if (br === 0) {
      // Both parts zero: the quotient is unbounded.
      re = ar === 0 && ai === 0 ? NaN : Infinity;
      im = 0;
    } else {
      const r = bi / br;
      const d = br + bi * r;
      re = (ar + ai * r) / d;
      im = (ai - ar * r) / d;
    }
  } else {
    const r = br / bi;
    const d = bi + br * r;
    re = (ar * r + ai) / d;
    im = (ai * r - ar) / d;
  }
  out[o] = re;
  out[o + 1] = im;
}

/** Writes 1/(re + j·im) into out[o], out[o+1]; 1/∞ = 0. */
export function cinv(re: number, im: number, out: Float64Array, o: number): void {
  if (!Number.isFinite(re) || !Number.isFinite(im)) {
    out[o] = 0;
    out[o + 1] = 0;
    return;
  }
  cdiv(1, 0, re, im, out, o);
}

/** Magnitude |re + j·im|. */
export function cabs(re: number, im: number): number {
  return Math.hypot(re, im);
}

/** Argument of re + j·im in radians, in (−π, π]. */
export function carg(re: number, im: number): number {
  return Math.atan2(im, re);
}

/** Writes the principal square root of re + j·im into out[o], out[o+1]. */
export function csqrt(re: number, im: number, out: Float64Array, o: number): void {
  const m = Math.hypot(re, im);
  const sr = Math.sqrt((m + re) / 2);
  const si = Math.sqrt((m - re) / 2);
  out[o] = sr;
  out[o + 1] = im < 0 ? -si : si;
}

/** True when a complex value stands for an open circuit (an infinite or undefined part). */
export function isOpen(re: number, im: number): boolean {
  return !Number.isFinite(re) || !Number.isFinite(im);
}
