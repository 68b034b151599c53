/**
 * Preferred-number series of IEC 60063 (E6, E12, E24, E48, E96) and snapping to them.
 *
 * Rule: the nearest preferred value is the one with the smallest |ln(value/preferred)|
 * (nearest in log ratio, the natural measure for a geometric series); on an exact tie the
 * larger value wins. Note that IEC 60063 departs from the ideal geometric values in
 * places (E24 has 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7 and 8.2 where 10^(k/24) rounds
 * differently), so the tables are written out rather than generated.
 */

export type PreferredSeries = 'E6' | 'E12' | 'E24' | 'E48' | 'E96';

/** The series offered to users, coarse to fine. */
export const PREFERRED_SERIES: readonly PreferredSeries[] = ['E6', 'E12', 'E24', 'E48', 'E96'];

/** One decade of each series, mantissas in [1, 10). */
export const SERIES_MANTISSAS: Readonly<Record<PreferredSeries, readonly number[]>> = {
  E6: [1.0, 1.5, 2.2, 3.3, 4.7, 6.8],
  E12: [1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2],
  E24: [
    1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6,
    6.2, 6.8, 7.5, 8.2, 9.1,
  ],
  // E48 is every second E96 value.
  E48: [
    1.0, 1.05, 1.1, 1.15, 1.21, 1.27, 1.33, 1.4, 1.47, 1.54, 1.62, 1.69, 1.78, 1.87, 1.96, 2.05,
    2.15, 2.26, 2.37, 2.49, 2.61, 2.74, 2.87, 3.01, 3.16, 3.32, 3.48, 3.65, 3.83, 4.02, 4.22, 4.42,
    4.64, 4.87, 5.11, 5.36, 5.62, 5.9, 6.19, 6.49, 6.81, 7.15, 7.5, 7.87, 8.25, 8.66, 9.09, 9.53,
  ],
  E96: [
    1.0, 1.02, 1.05, 1.07, 1.1, 1.13, 1.15, 1.18, 1.21, 1.24, 1.27, 1.3, 1.33, 1.37, 1.4, 1.43,
    1.47, 1.5, 1.54, 1.58, 1.62, 1.65, 1.69, 1.74, 1.78, 1.82, 1.87, 1.91, 1.96, 2.0, 2.05, 2.1,
    2.15, 2.21, 2.26, 2.32, 2.37, 2.43, 2.49, 2.55, 2.61, 2.67, 2.74, 2.8, 2.87, 2.94, 3.01, 3.09,
    3.16, 3.24, 3.32, 3.4, 3.48, 3.57, 3.65, 3.74, 3.83, 3.92, 4.02, 4.12, 4.22, 4.32, 4.42, 4.53,
    4.64, 4.75, 4.87, 4.99, 5.11, 5.23, 5.36, 5.49, 5.62, 5.76, 5.9, 6.04, 6.19, 6.34, 6.49, 6.65,
    6.81, 6.98, 7.15, 7.32, 7.5, 7.68, 7.87, 8.06, 8.25, 8.45, 8.66, 8.87, 9.09, 9.31, 9.53, 9.76,
  ],
};

/** Rounds away binary noise such as 3.3000000000000003. */
function tidy(v: number): number {
  return Number(v.toPrecision(12));
}

/**
 * The preferred value of `series` nearest to `value` in log ratio (see the module rule).
 * @throws RangeError when value is not a positive finite number.
 */
export function snapToSeries(value: number, series: PreferredSeries): number {
  if (!(value > 0) || !Number.isFinite(value)) {
    throw new RangeError(`snapToSeries: value must be a positive finite number (got ${value})`);
  }
  let exponent = Math.floor(Math.log10(value));
  let mantissa = value / 10 ** exponent;
  if (mantissa >= 10) {
    exponent += 1;
    mantissa /= 10;
  } else if (mantissa < 1) {
    exponent -= 1;
    mantissa *= 10;
  }
  let best = 10;
  let bestDistance = Math.abs(Math.log(10 / mantissa));
  for (const candidate of SERIES_MANTISSAS[series]) {
    const distance = Math.abs(Math.log(mantissa / candidate));
    if (distance < bestDistance) {
      best = candidate;
      bestDistance = distance;
    }
  }
  return tidy(best * 10 ** exponent);
}

/** Every value of a series between two decades (inclusive of the start decade's 1.0). */
export function seriesValues(
  series: PreferredSeries,
  fromExponent: number,
  toExponent: number,
): number[] {
  const out: number[] = [];
  for (let e = fromExponent; e <= toExponent; e++) {
    for (const m of SERIES_MANTISSAS[series]) out.push(tidy(m * 10 ** e));
  }
  return out;
}

/**
 * Snaps the chosen component values of a stage (e.g. a design's L and C) to a series and
 * reports how far each moved, so the caller can rebuild the stage and show the response
 * with real parts. Keys not listed are copied unchanged.
 */
export function snapComponentValues(
  values: Record<string, number>,
  keys: readonly string[],
  series: PreferredSeries,
): { values: Record<string, number>; changePercent: Record<string, number> } {
  const out = { ...values };
  const changePercent: Record<string, number> = {};
  for (const key of keys) {
    const v = values[key];
    if (v === undefined) {
      throw new RangeError(`snapComponentValues: no value "${key}" to snap`);
    }
    out[key] = snapToSeries(v, series);
    changePercent[key] = ((out[key] - v) / v) * 100;
  }
  return { values: out, changePercent };
}
