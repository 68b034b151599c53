/** Summary statistics, histograms and correlation for study results. */

export interface Summary {
  /** Trials with a value (a circuit not found in a trial gives none). */
  n: number;
  mean: number | null;
  sd: number | null;
  min: number | null;
  max: number | null;
}

export interface Histogram {
  /** Bin edges, one more than counts. */
  edges: number[];
  counts: number[];
}

const finiteOf = (xs: ArrayLike<number | null>): number[] => {
  const out: number[] = [];
  for (let i = 0; i < xs.length; i++) {
    const v = xs[i];
    if (v !== null && Number.isFinite(v)) out.push(v);
  }
  return out;
};

/** Mean, sample standard deviation (n − 1), extremes, over the finite values. */
export function summarise(xs: ArrayLike<number | null>): Summary {
  const v = finiteOf(xs);
  const n = v.length;
  if (n === 0) return { n, mean: null, sd: null, min: null, max: null };
  let sum = 0;
  let lo = Infinity;
  let hi = -Infinity;
  for (const x of v) {
    sum += x;
    if (x < lo) lo = x;
    if (x > hi) hi = x;
  }
  const mean = sum / n;
  let ss = 0;
  for (const x of v) ss += (x - mean) * (x - mean);
  return { n, mean, sd: n > 1 ? Math.sqrt(ss / (n - 1)) : 0, min: lo, max: hi };
}

/** Histogram over the finite values with `bins` equal bins from min to max. */
export function histogram(xs: ArrayLike<number | null>, bins = 30): Histogram {
  const v = finiteOf(xs);
  if (v.length === 0) return { edges: [], counts: [] };
  let lo = v[0];
  let hi = lo;
  for (const x of v) {
    if (x < lo) lo = x;
    if (x > hi) hi = x;
  }
  if (hi === lo) {
    const pad = Math.abs(lo) * 1e-9 || 1e-12;
    lo -= pad;
    hi += pad;
  }
  const width = (hi - lo) / bins;
  const counts = new Array<number>(bins).fill(0);
  for (const x of v) counts[Math.min(bins - 1, Math.floor((x - lo) / width))]++;
  const edges = Array.from({ length: bins + 1 }, (_, i) => lo + i * width);
  return { edges, counts };
}

/** Pearson correlation of the pairs where both are finite (null when undefined). */
export function correlation(
  a: ArrayLike<number | null>,
  b: ArrayLike<number | null>,
): number | null {
  let n = 0;
  let sa = 0;
  let sb = 0;
  for (let i = 0; i < a.length; i++) {
    const x = a[i];
    const y = b[i];
    if (x === null || y === null || !Number.isFinite(x) || !Number.isFinite(y)) continue;
    n++;
    sa += x;
    sb += y;
  }
  if (n < 3) return null;
  const ma = sa / n;
  const mb = sb / n;
  let sab = 0;
  let saa = 0;
  let sbb = 0;
  for (let i = 0; i < a.length; i++) {
    const x = a[i];
    const y = b[i];
    if (x === null || y === null || !Number.isFinite(x) || !Number.isFinite(y)) continue;
    sab += (x - ma) * (y - mb);
    saa += (x - ma) * (x - ma);
    sbb += (y - mb) * (y - mb);
  }
  return saa > 0 && sbb > 0 ? sab / Math.sqrt(saa * sbb) : null;
}
