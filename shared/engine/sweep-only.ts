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
import { buildChain, type BuildOptions } from './core/build';
import { withMessageFigures } from './core/format';
import { settleLoadLevel } from './core/load-level';
import { runNodeAnalysis, sharedWorkspace } from './core/nodes';
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

/** The workspace's key: its rows differ from a whole analysis's, so it is kept apart. */
const WORKSPACE = 'sweep-only';
/** The report reads the input's impedances (Zin, return loss) and no other node's. */
const INPUT_ONLY = [0];

/**
 * The chain's sweep report alone.
 * @param doc the document as the chain schema parsed it (`parseChainDocument`)
 * @throws ChainValidationError listing every problem (stage, parameter, what to fix)
 */
export function sweepChain(doc: ChainDocument, options: SweepOnlyOptions = {}): SweepReport {
  return withMessageFigures(options.figures, () => {
    const built = settleLoadLevel(buildChain(doc, options.catalogue ?? defaultCatalogue(), options)); // prettier-ignore
    const grid = frequencyGrid(built.settings.sweep);
    const ws = sharedWorkspace(WORKSPACE, built, grid.length, {
      voltageAt: built.userNodeFlat,
      impedanceAt: INPUT_ONLY,
    });
    const started = options.clock ? performance.now() : 0;
    const na = runNodeAnalysis(built, grid, ws);
    if (options.clock) options.clock.solveMs = performance.now() - started;
    return sweepReport(built, na, grid, options.inPlace === true);
  });
}
