/**
 * The sweep as plain arrays for plotting: step-up and phase per user node, the input
 * impedance and the return loss.
 *
 * The traces are computed when first read, not when the analysis runs: a logarithm, an
 * arctangent and a magnitude per node and point cost more than the whole node analysis, and
 * most readers take only some traces (the API sends the plotted ones, the phase rarely).
 * What they are computed from is copied out of the node analysis at once (its workspace is
 * reused by the next analysis), so a trace read later is the one of this analysis. A trace
 * is an ordinary enumerable property of a plain object: JSON, structured clone (worker
 * messages), spreading and deep equality all read it, and once read, or assigned, it is a
 * plain data property.
 */
import type { SweepReport } from '../types';
import type { BuiltChain } from './build';
import type { NodeAnalysis } from './nodes';

// Globals read once: a global lookup inside a hot loop is slow in some hosts (test VMs).
const { PI, abs, atan2, hypot, log10 } = Math;
const isFiniteNumber = Number.isFinite;

const db20 = (r: number) => 20 * log10(r);

/** What a lazily computed sweep report was copied from, for questions that need no trace. */
interface SweepSource {
  P: number;
  v: Float64Array;
  emf: Float64Array;
  zinRe: Float64Array;
  zinIm: Float64Array;
}
const sources = new WeakMap<SweepReport, SweepSource>();

/** Share of the values that are NaN. */
function nanShare(values: ArrayLike<number>): number {
  let lost = 0;
  for (let i = 0; i < values.length; i++) if (Number.isNaN(values[i])) lost++;
  return values.length === 0 ? 0 : lost / values.length;
}

/**
 * The share of points where a trace is NaN, for the input impedance (either part, the larger)
 * and each node's step-up, without computing a trace that has not been read: the step-up in
 * dB is NaN exactly where |V|/|Es| is, which finite values with a non-zero EMF never are.
 */
export function sweepNanShares(sweep: SweepReport): { zIn: number; stepUp: number[] } {
  const src = sources.get(sweep);
  if (!src) {
    return {
      zIn: Math.max(nanShare(sweep.zIn.re), nanShare(sweep.zIn.im)),
      stepUp: sweep.nodes.map((n) => nanShare(n.stepUpDb)),
    };
  }
  const { P, v, emf } = src;
  const stepUp = sweep.nodes.map((_, n) => {
    let lost = 0;
    for (let i = 0; i < P; i++) {
      const vr = v[2 * n * P + i];
      const vi = v[(2 * n + 1) * P + i];
      const e = emf[i];
      // x·0 is 0 exactly for finite x (NaN otherwise): the common case decided in one test,
      // without a square root.
      if (vr * 0 + vi * 0 + e * 0 === 0 && e !== 0) continue;
      if (Number.isNaN(hypot(vr, vi) / abs(e))) lost++;
    }
    return P === 0 ? 0 : lost / P;
  });
  return { zIn: Math.max(nanShare(src.zinRe), nanShare(src.zinIm)), stepUp };
}

/** Defines `obj[key]` as computed by `compute` on first read (then a plain data property). */
function lazy<T extends object>(obj: T, key: string, compute: () => unknown): void {
  const settle = (value: unknown) => {
    Object.defineProperty(obj, key, { value, writable: true, enumerable: true, configurable: true }); // prettier-ignore
    return value;
  };
  Object.defineProperty(obj, key, {
    enumerable: true,
    configurable: true,
    get: () => settle(compute()),
    set: settle,
  });
}

/**
 * Return loss against a real reference resistance, dB (the reports' own formula):
 * |Γ| = |Z − R|/|Z + R|, an open input reflecting totally.
 */
function returnLossAgainst(zr: number, zi: number, ref: number): number {
  const g = isFiniteNumber(zr) && isFiniteNumber(zi) ? hypot(zr - ref, zi) / hypot(zr + ref, zi) : 1; // prettier-ignore
  return 0 - db20(g);
}

/** Return loss against the source's own impedance (conjugate match), dB. */
function returnLossConjugate(zr: number, zi: number, sr: number, si: number): number {
  const open = !isFiniteNumber(zr) || !isFiniteNumber(zi) || !isFiniteNumber(sr) || !isFiniteNumber(si); // prettier-ignore
  return 0 - db20(open ? 1 : hypot(zr - sr, zi + si) / hypot(zr + sr, zi + si));
}

/**
 * The sweep report of a node analysis over the sweep grid.
 * @param reference the reference resistance chosen for the chain input, Ω; null to judge the
 *   return loss against the source's own impedance (the conjugate match it really wants)
 */
export function lazySweepReport(
  built: BuiltChain,
  na: NodeAnalysis,
  reference: number | null,
): SweepReport {
  const P = na.points;
  const flats = built.userNodeFlat;
  // The copy: per user node the voltage (re, im), then the EMF, then Zin and Zsrc at node 0.
  const U = flats.length;
  // One buffer for the whole copy (one allocation): the voltages, then six single traces.
  const all = new Float64Array((2 * U + 6) * P);
  const v = all.subarray(0, 2 * U * P);
  for (let n = 0; n < U; n++) {
    const k = flats[n] * P;
    v.set(na.vRe.subarray(k, k + P), 2 * n * P);
    v.set(na.vIm.subarray(k, k + P), (2 * n + 1) * P);
  }
  const trace = (from: Float64Array, slot: number) => {
    const t = all.subarray((2 * U + slot) * P, (2 * U + slot + 1) * P);
    t.set(from.subarray(0, P));
    return t;
  };
  const emf = trace(na.emf, 0);
  const freqs = trace(na.freqs, 1);
  const zinRe = trace(na.zinRe, 2);
  const zinIm = trace(na.zinIm, 3);
  const zsrcRe = trace(na.zsrcRe, 4);
  const zsrcIm = trace(na.zsrcIm, 5);

  const nodes = Array.from(flats, (_, index) => {
    const re = 2 * index * P;
    const im = re + P;
    const node = { index } as SweepReport['nodes'][number];
    lazy(node, 'stepUpDb', () => {
      const out = new Array<number>(P);
      for (let i = 0; i < P; i++) out[i] = db20(hypot(v[re + i], v[im + i]) / abs(emf[i]));
      return out;
    });
    lazy(node, 'phaseDeg', () => {
      const out = new Array<number>(P);
      for (let i = 0; i < P; i++) out[i] = (atan2(v[im + i], v[re + i]) * 180) / PI;
      return out;
    });
    return node;
  });
  // Keys in the order readers have always seen: freqsHz, nodes, zIn, returnLossDb.
  const report = {} as SweepReport;
  lazy(report, 'freqsHz', () => Array.from(freqs));
  report.nodes = nodes;
  lazy(report, 'zIn', () => ({ re: Array.from(zinRe), im: Array.from(zinIm) }));
  lazy(report, 'returnLossDb', () => {
    const out = new Array<number>(P);
    for (let i = 0; i < P; i++) {
      out[i] =
        reference === null
          ? returnLossConjugate(zinRe[i], zinIm[i], zsrcRe[i], zsrcIm[i])
          : returnLossAgainst(zinRe[i], zinIm[i], reference);
    }
    return out;
  });
  sources.set(report, { P, v, emf, zinRe, zinIm });
  return report;
}
