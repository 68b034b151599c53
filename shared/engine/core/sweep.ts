/**
 * The frequency grid of a sweep. The design frequency f0 is never taken from this grid: the
 * engine evaluates it on its own one-point grid so results at f0 are exact, whatever the
 * sweep's spacing.
 */

export interface SweepSpec {
  startHz: number;
  stopHz: number;
  points: number;
  scale: 'lin' | 'log';
}

/**
 * Frequencies of a sweep, Hz, ascending. `lin` spaces points evenly, `log` geometrically;
 * both include start and stop exactly. A one-point sweep is the single frequency `startHz`
 * (stop is ignored), so a zero-width sweep (start = stop) gives that frequency once per point.
 * @throws RangeError naming the field to fix when the sweep cannot be built.
 */
export function frequencyGrid(sweep: SweepSpec): Float64Array {
  const { startHz, stopHz, points, scale } = sweep;
  if (!Number.isFinite(startHz) || startHz <= 0) {
    throw new RangeError(`sweep: start must be a finite frequency above 0 Hz (got ${startHz})`);
  }
  if (!Number.isFinite(stopHz) || stopHz < startHz) {
    throw new RangeError(`sweep: stop must be finite and not below start (got ${stopHz})`);
  }
  if (!Number.isInteger(points) || points < 1) {
    throw new RangeError(`sweep: points must be a whole number of at least 1 (got ${points})`);
  }
  const f = new Float64Array(points);
  f[0] = startHz;
  if (points === 1) return f;
  const last = points - 1;
  if (scale === 'log') {
    const ratio = Math.log(stopHz / startHz) / last;
    for (let i = 1; i < last; i++) f[i] = startHz * Math.exp(ratio * i);
  } else {
    const step = (stopHz - startHz) / last;
    for (let i = 1; i < last; i++) f[i] = startHz + step * i;
  }
  f[last] = stopHz;
  return f;
}

/** `count` log-spaced frequencies from `lo` to `hi` inclusive (for local searches). */
export function logGrid(lo: number, hi: number, count: number): Float64Array {
  return frequencyGrid({ startHz: lo, stopHz: hi, points: count, scale: 'log' });
}
