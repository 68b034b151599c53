/**
 * Where a mixer's spurious responses fall: the pure frequency arithmetic, with no chain.
 *
 * An input at fRF and the LO at fLO give products |m·fLO ± n·fRF|. Every (m, n) with
 * m + n up to the chosen order whose product lands on the IF is a spurious response at
 *   fRF = (m·fLO + fIF)/n,  fRF = (m·fLO − fIF)/n  or  fRF = (fIF − m·fLO)/n,
 * whichever are above 0 Hz (the mixer spur relation, common practice). The wanted response is
 * (1, 1) at the signal frequency; the image is the other (1, 1); the half-IF response is
 * (2, 2) half an IF from the signal; (0, 1) is the IF itself leaking through the mixer;
 * (m, 0) is a harmonic of the LO landing in the IF passband whatever the input (a birdie).
 */

export type SpurKind = 'wanted' | 'image' | 'half-if' | 'if-feedthrough' | 'lo-harmonic' | 'spur';

export interface SpurFrequency {
  /** LO harmonic and input harmonic of the product. */
  m: number;
  n: number;
  /** m + n. */
  order: number;
  kind: SpurKind;
  /** Input frequency of the response (its centre), Hz; null for an LO harmonic (any input). */
  rfHz: number | null;
  /** Width of the input band that lands in the IF passband, Hz (the IF width / n). */
  widthHz: number;
}

/**
 * Every response up to `maxOrder` for a signal at `signalHz`, LO at `loHz`, IF `ifHz` with a
 * passband `ifBandwidthHz` wide (LO harmonics are listed only when one lands in it).
 * Sorted by order, then frequency.
 */
export function spurFrequencies(
  signalHz: number,
  loHz: number,
  ifHz: number,
  ifBandwidthHz: number,
  maxOrder: number,
): SpurFrequency[] {
  const out: SpurFrequency[] = [];
  const tol = 1e-9 * Math.max(signalHz, loHz, ifHz);
  for (let order = 1; order <= maxOrder; order++) {
    for (let n = 0; n <= order; n++) {
      const m = order - n;
      if (n === 0) {
        if (Math.abs(m * loHz - ifHz) <= ifBandwidthHz / 2) {
          out.push({ m, n, order, kind: 'lo-harmonic', rfHz: null, widthHz: ifBandwidthHz });
        }
        continue;
      }
      const seen: number[] = [];
      for (const num of [m * loHz + ifHz, m * loHz - ifHz, ifHz - m * loHz]) {
        const rf = num / n;
        if (!(rf > tol) || seen.some((s) => Math.abs(s - rf) <= tol)) continue;
        seen.push(rf);
        out.push({ m, n, order, kind: classify(m, n, rf, signalHz, ifHz, tol), rfHz: rf, widthHz: ifBandwidthHz / n }); // prettier-ignore
      }
    }
  }
  return out.sort((a, b) => a.order - b.order || (a.rfHz ?? 0) - (b.rfHz ?? 0));
}

function classify(m: number, n: number, rf: number, sig: number, ifHz: number, tol: number): SpurKind {
  if (m === 1 && n === 1) return Math.abs(rf - sig) <= tol ? 'wanted' : 'image';
  if (m === 0 && n === 1) return 'if-feedthrough';
  if (m === 2 && n === 2 && Math.abs(Math.abs(rf - sig) - ifHz / 2) <= tol) return 'half-if';
  return 'spur';
} // prettier-ignore

/**
 * Default suppression of each (m, n) product relative to the wanted (1, 1) output, dB,
 * indexed [n][m] for n, m = 0…5: the shape of a double-balanced diode mixer driven at about
 * −10 dBm RF with its rated LO (odd-m, n = 1 products weakest; even orders balanced out;
 * each step in n some 10–20 dB more). Common practice, from memory — not any one part's
 * data sheet: replace it with the table of the mixer you use. Beyond the table, each order
 * adds 10 dB to the last entry of its row or column.
 */
export const DEFAULT_MIXER_SUPPRESSION_DB: readonly (readonly number[])[] = [
  [0, 30, 40, 35, 45, 40],
  [25, 0, 35, 15, 40, 25],
  [60, 60, 65, 60, 65, 60],
  [70, 70, 75, 70, 75, 70],
  [80, 80, 85, 80, 85, 80],
  [90, 90, 90, 90, 90, 90],
];

/** Suppression (dB) of product (m, n) from a table indexed [n][m]. */
export function suppressionDb(table: readonly (readonly number[])[], m: number, n: number): number {
  if (m === 1 && n === 1) return 0;
  const rows = table.length;
  if (rows === 0) return 0;
  const ni = Math.min(n, rows - 1);
  const row = table[ni];
  const mi = Math.min(m, row.length - 1);
  return row[mi] + 10 * (n - ni) + 10 * (m - mi);
}
