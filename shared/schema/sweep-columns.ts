/**
 * The frequency sweep as the API sends it: one plain numeric array per trace (columnar),
 * only the traces the caller asked for, values rounded to a fixed number of significant
 * digits. Rounded values repeat their leading digits from point to point, so the answer
 * compresses to a fraction of the full-precision JSON (the sweep is for plotting; every
 * figure the reports state is computed at full precision and sent unrounded).
 */
import { z } from 'zod';
import type { AnalysisResult, SweepReport } from '../engine/types';
import { packColumn, unpackColumn, type PackedColumn, type SweepPacking } from './sweep-packing';

/** The traces a sweep can carry. */
export const SWEEP_TRACES = ['stepUp', 'phase', 'zIn', 'returnLoss'] as const;
export type SweepTrace = (typeof SWEEP_TRACES)[number];

/** What the editor plots: step-up at every node, input impedance and return loss. */
export const PLOTTED_TRACES: readonly SweepTrace[] = ['stepUp', 'zIn', 'returnLoss'];

/** Significant digits of every trace value (1 part in 10⁶: far below a plot's resolution). */
export const SWEEP_DIGITS = 6;
/** Significant digits of the frequencies (sub-hertz steps at a few hundred MHz survive). */
export const FREQUENCY_DIGITS = 12;

export const sweepTracesSchema = z
  .array(z.enum(SWEEP_TRACES, { error: `a sweep trace is one of ${SWEEP_TRACES.join(', ')}` }))
  .max(SWEEP_TRACES.length);

/** `traces=stepUp,zIn` in a query string, as the list the body form takes. */
export const sweepTracesQuerySchema = z
  .string()
  .max(100)
  .transform((s) => s.split(',').filter((t) => t !== ''))
  .pipe(sweepTracesSchema);

export interface SweepColumnsDto {
  /** Significant digits the trace values were rounded to. */
  digits: number;
  /** Frequency at the chain input of each point, Hz. */
  freqsHz: number[];
  /** Node index of each per-node column below, in order. */
  nodes: number[];
  /** Per node (order of `nodes`): voltage step-up re the source EMF, dB. */
  stepUpDb?: number[][];
  /** Per node (order of `nodes`): phase of the node voltage, degrees. */
  phaseDeg?: number[][];
  /** Impedance looking into the chain from the source, Ω. */
  zInRe?: number[];
  zInIm?: number[];
  /** Return loss at the input, dB. */
  returnLossDb?: number[];
}

/**
 * The sweep columns in the `differences` packing (`sweepPacking: 'differences'`, see
 * ./sweep-packing.ts): each column a `DifferenceColumn`, or a plain array where it could
 * not be packed exactly. Read back, the values are identical to the plain packing's.
 */
export interface DifferenceSweepDto {
  digits: number;
  packing: 'differences';
  freqsHz: PackedColumn;
  nodes: number[];
  stepUpDb?: PackedColumn[];
  phaseDeg?: PackedColumn[];
  zInRe?: PackedColumn;
  zInIm?: PackedColumn;
  returnLossDb?: PackedColumn;
}

/** An analysis as the API answers it: the engine's result with the sweep in columns. */
export type AnalysisDto = Omit<AnalysisResult, 'sweep'> & {
  sweep?: SweepColumnsDto | DifferenceSweepDto;
};

const POW10 = Array.from({ length: 23 }, (_, i) => 10 ** i);

/**
 * `v` rounded to `digits` significant digits. Dividing an integer by an exact power of ten
 * gives the double nearest the decimal, so JSON prints it in at most `digits` digits.
 */
export function roundSignificant(v: number, digits: number): number {
  if (v === 0 || !Number.isFinite(v)) return v;
  const shift = digits - 1 - Math.floor(Math.log10(Math.abs(v)));
  if (shift >= 0 && shift < POW10.length) return Math.round(v * POW10[shift]) / POW10[shift];
  if (shift < 0 && -shift < POW10.length) return Math.round(v / POW10[-shift]) * POW10[-shift];
  return Number(v.toPrecision(digits));
}

function rounded(values: ArrayLike<number>, digits: number): number[] {
  const out = new Array<number>(values.length);
  // JSON has no NaN or infinities: a point the engine could not evaluate is sent as null.
  for (let i = 0; i < values.length; i++) out[i] = roundSignificant(values[i], digits);
  return out;
}

/**
 * The traces of `sweep` asked for, in columns. `nodes` limits the per-node traces to those
 * node indices (default: every node). `packing: 'differences'` packs each column
 * (./sweep-packing.ts).
 */
export function sweepToColumns(
  sweep: SweepReport,
  traces: readonly SweepTrace[],
  nodes?: readonly number[],
  packing: SweepPacking = 'plain',
): SweepColumnsDto | DifferenceSweepDto {
  if (packing === 'differences') return differenceColumns(sweep, traces, nodes);
  const want = new Set(traces);
  const chosen = nodes ? sweep.nodes.filter((n) => nodes.includes(n.index)) : sweep.nodes;
  const out: SweepColumnsDto = {
    digits: SWEEP_DIGITS,
    freqsHz: rounded(sweep.freqsHz, FREQUENCY_DIGITS),
    nodes: chosen.map((n) => n.index),
  };
  if (want.has('stepUp')) out.stepUpDb = chosen.map((n) => rounded(n.stepUpDb, SWEEP_DIGITS));
  if (want.has('phase')) out.phaseDeg = chosen.map((n) => rounded(n.phaseDeg, SWEEP_DIGITS));
  if (want.has('zIn')) {
    out.zInRe = rounded(sweep.zIn.re, SWEEP_DIGITS);
    out.zInIm = rounded(sweep.zIn.im, SWEEP_DIGITS);
  }
  if (want.has('returnLoss')) out.returnLossDb = rounded(sweep.returnLossDb, SWEEP_DIGITS);
  return out;
}

function differenceColumns(
  sweep: SweepReport,
  traces: readonly SweepTrace[],
  nodes?: readonly number[],
): DifferenceSweepDto {
  const want = new Set(traces);
  const chosen = nodes ? sweep.nodes.filter((n) => nodes.includes(n.index)) : sweep.nodes;
  const pack = (values: readonly number[], digits = SWEEP_DIGITS) =>
    packColumn(values, digits, (v) => rounded(v, digits));
  const out: DifferenceSweepDto = {
    digits: SWEEP_DIGITS,
    packing: 'differences',
    freqsHz: pack(sweep.freqsHz, FREQUENCY_DIGITS),
    nodes: chosen.map((n) => n.index),
  };
  if (want.has('stepUp')) out.stepUpDb = chosen.map((n) => pack(n.stepUpDb));
  if (want.has('phase')) out.phaseDeg = chosen.map((n) => pack(n.phaseDeg));
  if (want.has('zIn')) {
    out.zInRe = pack(sweep.zIn.re);
    out.zInIm = pack(sweep.zIn.im);
  }
  if (want.has('returnLoss')) out.returnLossDb = pack(sweep.returnLossDb);
  return out;
}

/**
 * Reads the columns back into the engine's sweep form, from either packing. A trace that was not asked for reads
 * as empty arrays (a node without a phase column has an empty `phaseDeg`), so a reader
 * checks the lengths of the traces it did not ask for.
 */
export function columnsToSweep(dto: SweepColumnsDto | DifferenceSweepDto): SweepReport {
  const read = (column: PackedColumn | undefined) => (column ? unpackColumn(column) : []);
  return {
    freqsHz: read(dto.freqsHz),
    nodes: dto.nodes.map((index, i) => ({
      index,
      stepUpDb: read(dto.stepUpDb?.[i]),
      phaseDeg: read(dto.phaseDeg?.[i]),
    })),
    zIn: { re: read(dto.zInRe), im: read(dto.zInIm) },
    returnLossDb: read(dto.returnLossDb),
  };
}

/** An API answer in the engine's own form, as the client reads it. */
export function analysisFromDto(dto: AnalysisDto): AnalysisResult {
  const { sweep, ...rest } = dto;
  return sweep ? { ...rest, sweep: columnsToSweep(sweep) } : rest;
}
