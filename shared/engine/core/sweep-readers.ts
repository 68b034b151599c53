/**
 * The sweep's traces for writers that read each value once (the API's answer, the CLI's
 * table): the arrays a lazy report was made from, or a trace computed into a reused column,
 * the same numbers as the report's traces without settling them into arrays.
 */
import type { SweepReport } from '../types';
import { keptScratch } from './kept-scratch';
import { phaseAt, returnLossAt, sourceOf, stepUpAt } from './sweep-source';

/**
 * The sweep's columns for a writer that streams a long sweep: the frequencies and Zin as
 * the arrays the report was made from, and each node's step-up computed a block at a time,
 * the same numbers as the report's traces, without making a whole trace.
 */
export interface SweepColumns {
  freqs: ArrayLike<number>;
  zinRe: ArrayLike<number>;
  zinIm: ArrayLike<number>;
  /** Step-up of user node `node` (its index in `nodes`) at points from … from+count−1 into out[0 …]. */
  stepUpDb(node: number, from: number, count: number, out: Float64Array): void;
}

export function sweepColumns(sweep: SweepReport): SweepColumns {
  const src = sourceOf(sweep);
  if (!src) {
    return {
      freqs: sweep.freqsHz,
      zinRe: sweep.zIn.re,
      zinIm: sweep.zIn.im,
      stepUpDb: (node, from, count, out) => {
        const t = sweep.nodes[node].stepUpDb;
        for (let k = 0; k < count; k++) out[k] = t[from + k];
      },
    };
  }
  const { vRe, vIm, emf } = src;
  return {
    freqs: src.freqs,
    zinRe: src.zinRe,
    zinIm: src.zinIm,
    stepUpDb: (node, from, count, out) => {
      const re = vRe[node];
      const im = vIm[node];
      for (let k = 0; k < count; k++) out[k] = stepUpAt(re, im, emf, from + k);
    },
  };
}

/** Whether `obj[key]` is still a lazy trace: an accessor, neither read nor assigned yet. */
function isLazy(obj: object, key: string): boolean {
  return Object.getOwnPropertyDescriptor(obj, key)?.get !== undefined;
}

/** The column a computed trace is written into for `traceValues` (reused). */
const columnOf = keptScratch(1 << 16);

/** A trace of the whole sweep (not of one node). */
export type SweepTraceKey = 'freqsHz' | 'zInRe' | 'zInIm' | 'returnLossDb';

/**
 * A trace's values for a writer that reads each value once, the same numbers as the trace,
 * without settling a lazy trace (which makes an array of it): the frequencies and Zin as the
 * arrays the report was made from, the return loss computed into a column that the next call
 * overwrites (read it first). A trace already read or assigned, and a report not made
 * here, give the trace itself.
 */
export function traceValues(sweep: SweepReport, key: SweepTraceKey): ArrayLike<number> {
  const src = sourceOf(sweep);
  if (key === 'freqsHz') return src && isLazy(sweep, key) ? src.freqs : sweep.freqsHz;
  if (key === 'returnLossDb') {
    if (!src || !isLazy(sweep, key)) return sweep.returnLossDb;
    const out = columnOf(src.P);
    for (let i = 0; i < src.P; i++) out[i] = returnLossAt(src, i);
    return out;
  }
  if (src && isLazy(sweep, 'zIn')) return key === 'zInRe' ? src.zinRe : src.zinIm;
  return key === 'zInRe' ? sweep.zIn.re : sweep.zIn.im;
}

/**
 * A node's trace as `traceValues` gives the sweep's: a lazy one computed into the column the
 * next call overwrites, without settling it.
 */
export function nodeTraceValues(
  sweep: SweepReport,
  node: SweepReport['nodes'][number],
  key: 'stepUpDb' | 'phaseDeg',
): ArrayLike<number> {
  const src = sourceOf(sweep);
  const n = src && isLazy(node, key) ? src.nodes.indexOf(node) : -1;
  if (n < 0) return node[key];
  const { P, emf } = src!;
  const re = src!.vRe[n];
  const im = src!.vIm[n];
  const out = columnOf(P);
  if (key === 'stepUpDb') for (let i = 0; i < P; i++) out[i] = stepUpAt(re, im, emf, i);
  else for (let i = 0; i < P; i++) out[i] = phaseAt(re, im, i);
  return out;
}
