/**
 * Linearity cascades: input intercept and compression points in linear milliwatts with the
 * gain up to each stage's input, 1/IIP3 = 1/IIP3₁ + G₁/IIP3₂ + G₁G₂/IIP3₃ + …
 */

/**
 * Cumulative input-referred point (IIP3 or P1dB), dBm, of stages 0…k for each k. A stage with
 * no limit is given as Infinity (or null); a cascade with no limit yet gives Infinity.
 * @param gainsDb each stage's gain, dB (available gain where impedances are known)
 * @param pointsDbm each stage's own input point, dBm
 */
export function cascadeInputPoint(
  gainsDb: readonly number[],
  pointsDbm: readonly (number | null)[],
): number[] {
  if (gainsDb.length !== pointsDbm.length) {
    throw new RangeError(`cascade: ${gainsDb.length} gains but ${pointsDbm.length} points; give one of each per stage`); // prettier-ignore
  }
  const out: number[] = [];
  let inv = 0; // 1/IIP3 in 1/mW
  let g = 1;
  for (let k = 0; k < gainsDb.length; k++) {
    const p = pointsDbm[k];
    if (p !== null && Number.isFinite(p)) inv += g / Math.pow(10, p / 10);
    g *= Math.pow(10, gainsDb[k] / 10);
    out.push(inv > 0 ? -10 * Math.log10(inv) : Infinity);
  }
  return out;
}

/** Cumulative IIP3, dBm, of stages 0…k for each k (Infinity = no limit yet). */
export function cascadeIip3(
  gainsDb: readonly number[],
  iip3sDbm: readonly (number | null)[],
): number[] {
  return cascadeInputPoint(gainsDb, iip3sDbm);
}

/** Cumulative input P1dB, dBm, of stages 0…k, by the same rule as the IIP3 cascade. */
export function cascadeP1db(
  gainsDb: readonly number[],
  p1dbsDbm: readonly (number | null)[],
): number[] {
  return cascadeInputPoint(gainsDb, p1dbsDbm);
}
