/**
 * Air-core single-layer solenoid, Wheeler's formula (H. A. Wheeler, "Simple inductance
 * formulas for radio coils", Proc. IRE 16, 1928): L[µH] = d²·n² / (18·d + 40·l) with the
 * coil diameter d and winding length l in inches. Good to about 1 % when l > 0.4·d.
 */

const METRES_PER_INCH = 0.0254;

function checkGeometry(diameterM: number, lengthM: number): void {
  if (!(diameterM > 0) || !(lengthM > 0)) {
    throw new RangeError(
      `Wheeler coil: diameter and length must be above 0 m (got ${diameterM} m, ${lengthM} m)`,
    );
  }
}

/** Inductance (H) of n turns on a coil of the given diameter and winding length (m). */
export function wheelerInductance(turns: number, diameterM: number, lengthM: number): number {
  checkGeometry(diameterM, lengthM);
  const d = diameterM / METRES_PER_INCH;
  const l = lengthM / METRES_PER_INCH;
  return ((d * d * turns * turns) / (18 * d + 40 * l)) * 1e-6;
}

/** Turns (not rounded) for a wanted inductance (H) on the given coil form (m). */
export function wheelerTurns(inductanceH: number, diameterM: number, lengthM: number): number {
  checkGeometry(diameterM, lengthM);
  if (!(inductanceH > 0)) {
    throw new RangeError(`Wheeler coil: inductance must be above 0 H (got ${inductanceH})`);
  }
  const d = diameterM / METRES_PER_INCH;
  const l = lengthM / METRES_PER_INCH;
  return Math.sqrt(inductanceH * 1e6 * (18 * d + 40 * l)) / d;
}
