/**
 * The pass-band peak at one node: the input frequency where the step-up |V[node]|/|Es| is
 * highest within a search range, and its −3 dB (half-power) width. "Tune to f0" can put this
 * peak on the target instead of a resonator's resonance: where a tank is loaded from both
 * sides, or a pair is coupled past critical, the response peaks away from the resonance the
 * tank would have alone, and what the listener hears is the peak.
 *
 * The range is scanned on a logarithmic grid, the highest grid point is refined by golden
 * section search and the edges by regula falsi, all on the chain's own single-frequency
 * probe (the node analysis's formulas), so the answer does not depend on the grid.
 */
import type { BuiltChain } from '../core/build';
import { createProbe } from '../core/probe';
import { maximise, solveBracketed } from '../core/refine';
import { dbAt, gridMax } from '../core/response-shape';
import { StageParameterError } from '../errors';

/** Grid points of the scan that brackets the peak (log spaced). */
const SCAN_POINTS = 801;
/** The "−3 dB" points are the half-power points, 10·log10(2) dB down (common practice). */
const HALF_POWER_DB = 10 * Math.log10(2);

export interface PassbandPeak {
  /** User-level node (0 = the first stage's input). */
  node: number;
  peakHz: number;
  peakDb: number;
  /** −3 dB width around the peak, or null when an edge lies outside the range. */
  bandwidthHz: number | null;
}

/**
 * The highest peak of |V[node]|/|Es| between loHz and hiHz, or null when the highest point
 * is an end of the range (the response is still rising there: no peak inside).
 * @throws StageParameterError when the node does not exist.
 */
export function passbandPeak(
  built: BuiltChain,
  node: number,
  loHz: number,
  hiHz: number,
): PassbandPeak | null {
  const nodes = built.userNodeFlat.length;
  if (!Number.isInteger(node) || node < 0 || node >= nodes) {
    throw new StageParameterError(
      'peakNode',
      `node ${node} does not exist: this chain's nodes are 0 … ${nodes - 1}`,
    );
  }
  const flat = built.userNodeFlat[node];
  const probe = createProbe(built);
  const f = new Float64Array(SCAN_POINTS);
  const db = new Float64Array(SCAN_POINTS);
  const ratio = Math.log(hiHz / loHz) / (SCAN_POINTS - 1);
  for (let i = 0; i < SCAN_POINTS; i++) {
    f[i] = loHz * Math.exp(ratio * i);
    db[i] = dbAt(probe, flat, f[i]);
  }
  const k = gridMax(db);
  if (k <= 0 || k >= SCAN_POINTS - 1) return null;
  const [peakHz, peakDb] = maximise((x) => dbAt(probe, flat, x), f[k - 1], f[k + 1], 1e-13);
  const level = peakDb - HALF_POWER_DB;
  const edge = (dir: -1 | 1): number | null => {
    for (let i = k; i + dir >= 0 && i + dir < SCAN_POINTS; i += dir) {
      if (!(db[i + dir] < level)) continue;
      const g = (x: number) => dbAt(probe, flat, x) - level;
      const fHz = solveBracketed(g, f[Math.min(i, i + dir)], f[Math.max(i, i + dir)]);
      return Number.isFinite(fHz) ? fHz : null;
    }
    return null;
  };
  const lo = edge(-1);
  const hi = edge(1);
  return { node, peakHz, peakDb, bandwidthHz: lo !== null && hi !== null ? hi - lo : null };
}
