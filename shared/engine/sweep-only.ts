/**
 * The sweep alone: every user node's step-up and phase, the input impedance and the return
 * loss at every point, the numbers `analyzeChain(doc, { sweep: true }).sweep` gives, without
 * the findings at f0 (resonators, selectivity, noise, levels, flags). For a caller that wants
 * the swept table only (the CLI's `--sweep-only`, e.g. to hand a long sweep to another tool).
 *
 * The chain is built, its load settled at its level and solved over the same grid by the
 * same node analysis as in a whole analysis, so every value is the same to the bit. What
 * differs is what the solve keeps: the whole analysis keeps each resonator node's
 * frequencies and impedances for the resonator search; this keeps the user nodes' voltages
 * and the input's impedances only, all the report reads (at 100,000 points on the bench
 * chain about a third of the memory, and so of the pages the solve first touches).
 */
import type { ChainDocument } from '../schema/chain';
import type { SolveClock } from './analyze';
import { buildChain, type BuildOptions, type BuiltChain } from './core/build';
import { withMessageFigures } from './core/format';
import { settleLoadLevel } from './core/load-level';
import {
  createNodeAnalysis,
  runNodeAnalysis,
  sharedWorkspace,
  type NodeAnalysis,
} from './core/nodes';
import { sweepReport } from './core/reports';
import { frequencyGrid } from './core/sweep';
import { defaultCatalogue } from './default-catalogue';
import type { StageDefinition, SweepReport } from './types';

export interface SweepOnlyOptions extends BuildOptions {
  /** Stage types to accept (default: the product's stage catalogue). */
  catalogue?: readonly StageDefinition[];
  /** Significant figures of validation issues (2..8; default 3). */
  figures?: number;
  /** Filled in with how long the solve took. */
  clock?: SolveClock;
  /**
   * The report reads the solve's workspace in place instead of a copy, for a caller that
   * writes it out before it starts another analysis (see `AnalyzeOptions.sweepInPlace`).
   */
  inPlace?: boolean;
}

/**
 * Points solved at a time by {@link sweepChainInChunks}: the rows of one chunk (about 0.9 MB
 * on the bench chain) are written over by the next, so a long sweep's solve never touches
 * fresh memory after its first chunk.
 */
export const SWEEP_CHUNK = 4096;

/** The workspace's key: its rows differ from a whole analysis's, so it is kept apart. */
const WORKSPACE = 'sweep-only';
/** The report reads the input's impedances (Zin, return loss) and no other node's. */
const INPUT_ONLY = [0];

/** The chain built, its load settled at its level, and its sweep's frequency grid. */
function builtForSweep(doc: ChainDocument, options: SweepOnlyOptions) {
  const built = settleLoadLevel(buildChain(doc, options.catalogue ?? defaultCatalogue(), options)); // prettier-ignore
  return { built, grid: frequencyGrid(built.settings.sweep) };
}

/** The rows the sweep's report reads: every user node's voltage, the input's impedances. */
const keptRows = (built: BuiltChain) => ({ voltageAt: built.userNodeFlat, impedanceAt: INPUT_ONLY }); // prettier-ignore

/**
 * The chain's sweep report alone.
 * @param doc the document as the chain schema parsed it (`parseChainDocument`)
 * @throws ChainValidationError listing every problem (stage, parameter, what to fix)
 */
export function sweepChain(doc: ChainDocument, options: SweepOnlyOptions = {}): SweepReport {
  return withMessageFigures(options.figures, () => {
    const { built, grid } = builtForSweep(doc, options);
    const ws = sharedWorkspace(WORKSPACE, built, grid.length, keptRows(built));
    const started = options.clock ? performance.now() : 0;
    const na = runNodeAnalysis(built, grid, ws);
    if (options.clock) options.clock.solveMs = performance.now() - started;
    return sweepReport(built, na, grid, options.inPlace === true);
  });
}

export interface SweepChunkOptions extends SweepOnlyOptions {
  /** Points per chunk (default {@link SWEEP_CHUNK}); at least 1. */
  chunkPoints?: number;
}

/**
 * The chain's sweep a chunk of points at a time, for a caller that writes each out before
 * the next is solved (the CLI's `--sweep-only` table): `visit` gets each chunk's report
 * (points `from` … `from + report.freqsHz.length − 1` of the grid) and the grid's length.
 *
 * Every point's values are those of {@link sweepChain}, to the bit: the node analysis takes
 * each point on its own, so where a chunk starts changes no number. What the chunks change is
 * memory: the solve's rows are one chunk long and reused, so a 100,000-point sweep holds (and
 * first touches, a page fault per 4 KiB) about 1 MB of them instead of 21 MB. A chunk's report
 * reads the workspace in place: read it before `visit` returns (once the next chunk is solved,
 * reading it throws).
 * `options.clock.solveMs` is the sum of the chunks' solves (not the time in `visit`).
 * @throws ChainValidationError listing every problem (stage, parameter, what to fix)
 */
export function sweepChainInChunks(
  doc: ChainDocument,
  options: SweepChunkOptions,
  visit: (chunk: SweepReport, from: number, points: number) => void,
): void {
  const chunk = options.chunkPoints ?? SWEEP_CHUNK;
  if (!Number.isInteger(chunk) || chunk < 1) {
    throw new RangeError(`chunkPoints must be a whole number of at least 1 (got ${chunk})`);
  }
  withMessageFigures(options.figures, () => {
    const { built, grid } = builtForSweep(doc, options);
    const P = grid.length;
    const rows = keptRows(built);
    // One workspace for the full chunks and one for a shorter last chunk: a workspace fits
    // one number of points.
    let full: NodeAnalysis | undefined;
    let solveMs = 0;
    for (let from = 0; from < P; from += chunk) {
      const n = Math.min(chunk, P - from);
      const ws = n === chunk ? (full ??= createNodeAnalysis(built, n, rows)) : createNodeAnalysis(built, n, rows); // prettier-ignore
      const freqs = grid.subarray(from, from + n);
      const started = options.clock ? performance.now() : 0;
      const na = runNodeAnalysis(built, freqs, ws);
      if (options.clock) solveMs += performance.now() - started;
      visit(sweepReport(built, na, freqs, true), from, P);
    }
    if (options.clock) options.clock.solveMs = solveMs;
  });
}
