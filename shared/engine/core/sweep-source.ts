/**
 * What a lazy sweep report (./sweep-report.ts) was made from, and the per-point formulas of
 * its traces, shared by the report and by the readers that write a trace without settling
 * it (./sweep-readers.ts), so both give the same numbers.
 */
import { attachment } from './attached';
import type { SweepReport } from '../types';
import { hypot2 } from './hypot';
import type { NodeAnalysis } from './nodes';

// Globals read once: a global lookup inside a hot loop is slow in some hosts (test VMs).
const { PI, abs, atan2, log10 } = Math;
const isFiniteNumber = Number.isFinite;

const db20 = (r: number) => 20 * log10(r);

/** What a lazily computed sweep report was made from, for questions that need no trace. */
export interface SweepSource {
  P: number;
  /** Per user node, the voltage's real and imaginary parts over the sweep. */
  vRe: Float64Array[];
  vIm: Float64Array[];
  emf: Float64Array;
  freqs: Float64Array;
  zinRe: Float64Array;
  zinIm: Float64Array;
  /** Per user node, whether its voltage's parts are finite at every point (found as copied). */
  vFinite: boolean[];
  /** Whether both parts of the input impedance are finite at every point. */
  zinFinite: boolean;
  zsrcRe: Float64Array;
  zsrcIm: Float64Array;
  reference: number | null;
  /** The report's node objects, in the order of `vRe`/`vIm`. */
  nodes: SweepReport['nodes'];
  /** A reused workspace read in place, and its run count then (see `inPlace`). */
  lent?: NodeAnalysis;
  lentRuns?: number;
}
/** Each lazy report's source (see `lazySweepReport`). */
export const sources = attachment<SweepReport, SweepSource>('sweep source');

/** Refuses a source whose workspace, read in place, a later run has overwritten. */
export function checkLent(src: SweepSource): SweepSource {
  if (src.lent && src.lent.runs !== src.lentRuns) {
    throw new Error(
      'the sweep report was read after a later analysis reused its workspace (it was made ' +
        'to be read in place, before the next analysis)',
    );
  }
  return src;
}

/** The report's source, if it has one, refused when read in place after its workspace's reuse. */
export function sourceOf(sweep: SweepReport): SweepSource | undefined {
  const src = sources.get(sweep);
  return src && checkLent(src);
}

/** Step-up at point i, dB: |V|/|Es| (the one formula of the trace and its readers). */
export function stepUpAt(re: Float64Array, im: Float64Array, emf: Float64Array, i: number): number {
  return db20(hypot2(re[i], im[i]) / abs(emf[i]));
}

/** Phase at point i, degrees. */
export function phaseAt(re: Float64Array, im: Float64Array, i: number): number {
  return (atan2(im[i], re[i]) * 180) / PI;
}

/** Return loss at point i, dB, against `reference` or (null) the source's own impedance. */
export function returnLossAt(src: SweepSource, i: number): number {
  const { zinRe, zinIm, reference } = src;
  return reference === null
    ? returnLossConjugate(zinRe[i], zinIm[i], src.zsrcRe[i], src.zsrcIm[i])
    : returnLossAgainst(zinRe[i], zinIm[i], reference);
}

/**
 * Return loss against a real reference resistance, dB (the reports' own formula):
 * |Γ| = |Z − R|/|Z + R|, an open input reflecting totally.
 */
function returnLossAgainst(zr: number, zi: number, ref: number): number {
  const g = isFiniteNumber(zr) && isFiniteNumber(zi) ? hypot2(zr - ref, zi) / hypot2(zr + ref, zi) : 1; // prettier-ignore
  return 0 - db20(g);
}

/** Return loss against the source's own impedance (conjugate match), dB. */
function returnLossConjugate(zr: number, zi: number, sr: number, si: number): number {
  const open = !isFiniteNumber(zr) || !isFiniteNumber(zi) || !isFiniteNumber(sr) || !isFiniteNumber(si); // prettier-ignore
  return 0 - db20(open ? 1 : hypot2(zr - sr, zi + si) / hypot2(zr + sr, zi + si));
}
