import type {
  LevelsReport,
  NodeReport,
  StageReport,
  SweepReport,
} from '../../../../../shared/engine/types';
import type { ChainDocument } from '../../../../../shared/schema/chain';

/**
 * The parts of an analysis the knob's worker recomputes while a value turns: the sweep the
 * main plots draw and the f0 figures (nodes, stages, levels) the key figures come from.
 */
export interface LiveAnalysis {
  sweep: SweepReport;
  nodes: NodeReport[];
  stages: StageReport[];
  levels: LevelsReport;
}

/** What the page asks the knob worker. */
export interface KnobQuestion {
  id: number;
  document: ChainDocument;
  /** The mode on screen, whose stages the results are read against; absent: as written. */
  mode?: string;
}

/** What the knob worker answers: the live response at the last node and its key figures. */
export type KnobAnswer =
  | {
      id: number;
      ok: true;
      freqsHz: number[];
      stepUpDb: number[];
      peakHz: number | null;
      bw3dbHz: number | null;
      /** Step-up from the source EMF to the last node at f0, dB. */
      stepUpAtF0Db: number;
      /** The same, for the main results panel while the value turns. */
      live: LiveAnalysis;
      /** Time the worker took, ms. */
      ms: number;
    }
  | { id: number; ok: false; message: string };
