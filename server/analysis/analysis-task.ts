/**
 * What the event loop hands an analysis thread and what it gets back. Only plain data
 * crosses: errors are turned into outcomes in the thread, because a thrown error loses its
 * class and fields on the way back.
 */
import type { MeasuredNetwork } from '../../shared/engine/types';
import type { ChainDocument } from '../../shared/schema/chain';
import type { SweepTrace } from '../../shared/schema/sweep-columns';
import type { SweepPacking } from '../../shared/schema/sweep-packing';
import type { DesignOp } from '../design/design-ops';
import type { AnswerEncoding } from './answer-encoding';
import type { ExportFile, ExportSpec } from './export-file';

export interface AnalysisTask {
  document: ChainDocument;
  dataFiles?: Record<string, MeasuredNetwork>;
  /**
   * `answer`: the API's JSON answer as text (serialised in the thread, so the event loop only
   * sends it); `flag-count`: the number of warning and error flags, for the chain list;
   * `result`: the engine's whole result as JSON text (with the sweep arrays when `traces` is
   * not empty), for a revision diff; `design`: design operation `op` on
   * `request` (the parsed body), its answer as JSON text; `shared`: a shared link's figures
   * (the whole result and, for a chain with modes, each mode's) as JSON text; `export`: the
   * file `export` asks for.
   */
  want: 'answer' | 'flag-count' | 'result' | 'design' | 'shared' | 'export';
  /** The export asked for (`want: 'export'`). */
  export?: ExportSpec;
  /** The design operation (`want: 'design'`). */
  op?: DesignOp;
  /** The parsed request body of the design operation, without its document (sent once, above). */
  request?: unknown;
  /** Sweep traces to include in the answer; none leaves the sweep out. */
  traces: readonly SweepTrace[];
  /** How the answer's sweep columns travel (absent: plain arrays). */
  packing?: SweepPacking;
  /** Limit the per-node sweep traces to these node indices. */
  nodes?: readonly number[];
  /** Add the receiver plan (`'full'`: with the spur chart and the IF choice). */
  plan?: boolean | 'full';
  /** The mode to analyse (absent: the first mode, or the chain as written without modes). */
  mode?: string;
  /** Analyse every mode; the answer is a `ModesAnalysisDto`. */
  allModes?: boolean;
  /** Significant figures of the engine's messages (flags, issues); absent: the engine's 3. */
  figures?: number;
  /** `answer`: compress it so (the encoding the client accepts); none sends it as it is. */
  encoding?: AnswerEncoding;
}

export type AnalysisOutcome =
  /** The API's JSON answer as bytes, compressed in `encoding` when that is set. */
  | { kind: 'answer'; body: Uint8Array; encoding?: AnswerEncoding }
  | { kind: 'flag-count'; count: number }
  | { kind: 'json'; json: string }
  | { kind: 'export'; file: ExportFile }
  | {
      kind: 'refused';
      /** The API's error code (default `invalid-chain`). */
      code?: string;
      message: string;
      details: unknown;
    };
