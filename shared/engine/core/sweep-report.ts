/**
 * The sweep as plain arrays for plotting: step-up and phase per user node, the input
 * impedance and the return loss.
 *
 * The traces are computed when first read, not when the analysis runs: a logarithm, an
 * arctangent and a magnitude per node and point cost more than the whole node analysis, and
 * most readers take only some traces (the API sends the plotted ones, the phase rarely).
 * What they are computed from is copied out of the node analysis at once (its workspace is
 * reused by the next analysis; a one-off workspace is read in place), so a trace read later
 * is the one of this analysis. A trace is an ordinary enumerable property of a plain object:
 * JSON, structured clone (worker messages), spreading and deep equality all read it, and
 * once read, or assigned, it is a plain data property.
 */
import type { SweepReport } from '../types';
import type { BuiltChain } from './build';
import { impedanceRow, isOneOffWorkspace, voltageRow, type NodeAnalysis } from './nodes';
import {
  checkLent,
  phaseAt,
  returnLossAt,
  sourceOf,
  sources,
  stepUpAt,
  type SweepSource,
} from './sweep-source';

// Globals read once: a global lookup inside a hot loop is slow in some hosts (test VMs).
const { abs, hypot } = Math;

/** Whether every value is finite (x·0 is 0 exactly for finite x, else NaN). */
function allFinite(values: Float64Array): boolean {
  for (let i = 0; i < values.length; i++) if (values[i] * 0 !== 0) return false;
  return true;
}

/**
 * Copies `from` into `to` (natively) and tells whether every value is finite: x·0 is 0
 * exactly for finite x and NaN otherwise, so a sum of them is 0 only when all are finite.
 * Four sums, each over every fourth value: one running sum waits for each addition before
 * the next (a chain of additions twice as slow as the copy and the test together).
 */
function copyAllFinite(from: Float64Array, to: Float64Array): boolean {
  to.set(from);
  const n = from.length;
  let a = 0;
  let b = 0;
  let c = 0;
  let d = 0;
  let i = 0;
  for (; i + 3 < n; i += 4) {
    a += from[i] * 0;
    b += from[i + 1] * 0;
    c += from[i + 2] * 0;
    d += from[i + 3] * 0;
  }
  for (; i < n; i++) a += from[i] * 0;
  return a + b + c + d === 0;
}

/** Share of the values that are NaN. */
function nanShare(values: ArrayLike<number>): number {
  if (values instanceof Float64Array && allFinite(values)) return 0;
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
  const src = sourceOf(sweep);
  if (!src) {
    return {
      zIn: Math.max(nanShare(sweep.zIn.re), nanShare(sweep.zIn.im)),
      stepUp: sweep.nodes.map((n) => nanShare(n.stepUpDb)),
    };
  }
  const { P, emf } = src;
  // The common case in plain passes: every EMF finite and non-zero and a node's voltages all
  // finite (as the report found when it copied them), so none of its points can be lost.
  let emfUsable = true;
  for (let i = 0; i < P && emfUsable; i++) emfUsable = emf[i] * 0 === 0 && emf[i] !== 0;
  const stepUp = sweep.nodes.map((_, n) => {
    const re = src.vRe[n];
    const im = src.vIm[n];
    if (emfUsable && src.vFinite[n]) return 0;
    let lost = 0;
    for (let i = 0; i < P; i++) {
      const vr = re[i];
      const vi = im[i];
      const e = emf[i];
      // x·0 is 0 exactly for finite x (NaN otherwise): the common case decided in one test,
      // without a square root.
      if (vr * 0 + vi * 0 + e * 0 === 0 && e !== 0) continue;
      if (Number.isNaN(hypot(vr, vi) / abs(e))) lost++;
    }
    return P === 0 ? 0 : lost / P;
  });
  const zIn = src.zinFinite ? 0 : Math.max(nanShare(src.zinRe), nanShare(src.zinIm));
  return { zIn, stepUp };
}

/**
 * Makes `obj[key]` a plain data property holding `value` (a lazy trace once read or assigned)
 * and returns the value.
 */
function settle<T>(obj: object, key: string, value: T): T {
  Object.defineProperty(obj, key, { value, writable: true, enumerable: true, configurable: true }); // prettier-ignore
  return value;
}

/**
 * The sweep report of a node analysis over the sweep grid.
 * @param reference the reference resistance chosen for the chain input, Ω; null to judge the
 *   return loss against the source's own impedance (the conjugate match it really wants)
 * @param inputFreqs the frequencies the node analysis ran over, when the caller neither
 *   changes nor reuses them: read as they are instead of copied from the workspace
 * @param inPlace read a reused workspace in place, not a copy: for a caller that reads the
 *   report before the workspace's next run, after which every read of it throws
 */
export function lazySweepReport(
  built: BuiltChain,
  na: NodeAnalysis,
  reference: number | null,
  inputFreqs?: Float64Array,
  inPlace = false,
): SweepReport {
  const P = na.points;
  const flats = built.userNodeFlat;
  const U = flats.length;
  const ownFreqs = inputFreqs?.length === P ? inputFreqs : undefined;
  // A workspace the next analysis may reuse is copied (one allocation: per user node the
  // voltage, then the single traces: the EMF, Zin, the frequencies unless given, and the
  // source's impedance when the return loss is judged against it); a one-off one (a long
  // sweep) is read in place, which spares a second copy of the largest arrays of the analysis.
  const single = 3 + (ownFreqs ? 0 : 1) + (reference === null ? 2 : 0);
  const oneOff = isOneOffWorkspace(na);
  const all = oneOff || inPlace ? null : new Float64Array((2 * U + single) * P);
  let slot = 0;
  const trace = (from: Float64Array, row: number) => {
    const view = from.subarray(row * P, (row + 1) * P);
    if (!all) return view;
    const t = all.subarray(slot * P, ++slot * P);
    t.set(view);
    return t;
  };
  // The traces the last check reads for lost points: whether they are all finite is found
  // while copying them (read in place, by one pass over them).
  let finite = true;
  const checkedTrace = (from: Float64Array, row: number) => {
    const view = from.subarray(row * P, (row + 1) * P);
    if (!all) {
      finite = allFinite(view);
      return view;
    }
    const t = all.subarray(slot * P, ++slot * P);
    finite = copyAllFinite(view, t);
    return t;
  };
  const vRe: Float64Array[] = [];
  const vIm: Float64Array[] = [];
  const vFinite: boolean[] = [];
  for (let n = 0; n < U; n++) {
    const row = voltageRow(na, flats[n]);
    vRe.push(checkedTrace(na.vRe, row));
    const reFinite = finite;
    vIm.push(checkedTrace(na.vIm, row));
    vFinite.push(reFinite && finite);
  }
  const emf = trace(na.emf, 0);
  const freqs = ownFreqs ?? trace(na.freqs, 0);
  const input = impedanceRow(na, 0);
  const zinRe = checkedTrace(na.zinRe, input);
  const reFinite = finite;
  const zinIm = checkedTrace(na.zinIm, input);
  const zinFinite = reFinite && finite;
  // Read only by the return loss against the source's own impedance.
  const zsrcRe = reference === null ? trace(na.zsrcRe, input) : zinRe;
  const zsrcIm = reference === null ? trace(na.zsrcIm, input) : zinIm;

  // Each trace an accessor written in an object literal (own, enumerable, configurable, as
  // defineProperty would make it, without its cost): computed on first read, then settled.
  const nodes = Array.from(flats, (_, index) => {
    const re = vRe[index];
    const im = vIm[index];
    const node: SweepReport['nodes'][number] = {
      index,
      get stepUpDb() {
        checkLent(source);
        const out = new Array<number>(P);
        for (let i = 0; i < P; i++) out[i] = stepUpAt(re, im, emf, i);
        return settle(node, 'stepUpDb', out);
      },
      set stepUpDb(value) {
        settle(node, 'stepUpDb', value);
      },
      get phaseDeg() {
        checkLent(source);
        const out = new Array<number>(P);
        for (let i = 0; i < P; i++) out[i] = phaseAt(re, im, i);
        return settle(node, 'phaseDeg', out);
      },
      set phaseDeg(value) {
        settle(node, 'phaseDeg', value);
      },
    };
    return node;
  });
  const source: SweepSource = {
    P,
    vRe,
    vIm,
    emf,
    freqs,
    zinRe,
    zinIm,
    vFinite,
    zinFinite,
    zsrcRe,
    zsrcIm,
    reference,
    nodes,
    // A reused workspace read in place: refused once its next run has overwritten it.
    lent: all || oneOff ? undefined : na,
    lentRuns: na.runs,
  };
  // Keys in the order readers have always seen: freqsHz, nodes, zIn, returnLossDb.
  const report: SweepReport = {
    get freqsHz() {
      checkLent(source);
      return settle(report, 'freqsHz', Array.from(freqs));
    },
    set freqsHz(value) {
      settle(report, 'freqsHz', value);
    },
    nodes,
    get zIn() {
      checkLent(source);
      return settle(report, 'zIn', { re: Array.from(zinRe), im: Array.from(zinIm) });
    },
    set zIn(value) {
      settle(report, 'zIn', value);
    },
    get returnLossDb() {
      checkLent(source);
      const out = new Array<number>(P);
      for (let i = 0; i < P; i++) out[i] = returnLossAt(source, i);
      return settle(report, 'returnLossDb', out);
    },
    set returnLossDb(value) {
      settle(report, 'returnLossDb', value);
    },
  };
  sources.set(report, source);
  return report;
}
