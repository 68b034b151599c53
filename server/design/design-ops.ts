/**
 * The design assistants by name, as the analysis thread runs them: the route parses and
 * authorises a request, the thread (server/analysis/analysis-worker.ts) looks the operation up
 * here and runs it on the parsed body. Only plain data crosses between them.
 */
import type { z } from 'zod';
import * as design from '../../shared/engine/design';
import type {
  matchHereRequestSchema,
  partsRequestSchema,
  snapRequestSchema,
  tuneCandidatesRequestSchema,
  tunePairRequestSchema,
  tuneRequestSchema,
} from '../../shared/schema/api';

type Options = design.DesignOptions;

/** Each operation on its parsed request body. */
const OPS = {
  'tune/candidates': (b: z.infer<typeof tuneCandidatesRequestSchema>, o: Options) =>
    design.tuneCandidates(b.document, b.resonator, o),
  tune: (b: z.infer<typeof tuneRequestSchema>, o: Options) =>
    design.tuneResonator(
      b.document,
      { resonator: b.resonator, element: b.element, targetHz: b.targetHz, peakNode: b.peakNode },
      o,
    ),
  'tune-pair': (b: z.infer<typeof tunePairRequestSchema>, o: Options) => {
    const { document: _doc, workspaceId: _w, ...request } = b;
    return design.tunePair(b.document, request, o);
  },
  'match-here': (b: z.infer<typeof matchHereRequestSchema>, o: Options) => {
    const { document: _doc, workspaceId: _w, ...request } = b;
    return design.matchHere(b.document, request, o);
  },
  snap: (b: z.infer<typeof snapRequestSchema>, o: Options) =>
    design.snapChain(b.document, { series: b.series, stageId: b.stageId }, o),
  parts: (b: z.infer<typeof partsRequestSchema>, o: Options) => {
    const stage = design.stageOf(b.document, b.stageId);
    const form = b.coilForm ?? design.DEFAULT_COIL_FORM;
    const rows = design.stageParts(stage, form, o);
    return { stageId: stage.id, rows, csv: design.stagePartsCsv(stage, rows, form) };
  },
};

export type DesignOp = keyof typeof OPS;
export type DesignBody<K extends DesignOp> = Parameters<(typeof OPS)[K]>[0];

/** Runs design operation `op` on its parsed body (throws what the engine throws). */
export function runDesignOp(op: DesignOp, body: unknown, options: Options): unknown {
  const fn = OPS[op] as (b: unknown, o: Options) => unknown;
  if (!fn) throw new Error(`no design operation "${op}"`);
  return fn(body, options);
}
