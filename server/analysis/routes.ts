import { Router, type Request, type Response } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import { z } from 'zod';
import { catalogue } from '../../shared/engine';
import { analysisRequestSchema } from '../../shared/schema/api';
import type { ChainDocument } from '../../shared/schema/chain';
import {
  PLOTTED_TRACES,
  sweepTracesQuerySchema,
  type SweepTrace,
} from '../../shared/schema/sweep-columns';
import { sweepPackingSchema, type SweepPacking } from '../../shared/schema/sweep-packing';
import { storedDocument } from '../chains/stored-document';
import { HttpError } from '../common/errors';
import { chainRoleInOneQuery } from '../common/one-query-access';
import { currentUser, requireUser } from '../common/roles';
import { parseOr422 } from '../common/validate';
import { assertCanRead, loadDataFiles } from '../files/data-files';
import { assertWithinBudget, runOnPool } from './analysis-pool';
import { cachedOutcome, wantsFresh } from './answer-cache';
import { answerEncoding, sendAnswer } from './answer-encoding';
import type { AnalysisTask } from './analysis-task';

/**
 * Runs the analysis on the thread pool with the data files the stages refer to (from
 * `workspaceId` only) and sends the answer the thread serialised and compressed (in the
 * encoding the client accepts), or the same answer kept from a moment ago (./answer-cache.ts,
 * `x-analysis-answer: cached`); the engine's refusal is a 422 `invalid-chain` with its
 * issues as details.
 */
async function analyze(
  em: EntityManager,
  req: Request,
  res: Response,
  doc: ChainDocument,
  traces: readonly SweepTrace[],
  nodes: readonly number[] | undefined,
  workspaceId: string | undefined,
  plan: boolean | 'full' = false,
  modes: { mode?: string; allModes?: boolean; figures?: number } = {},
  packing: SweepPacking = 'plain',
) {
  // Every mode is a whole analysis of its own.
  assertWithinBudget(doc, modes.allModes ? Math.max(1, doc.modes?.length ?? 0) : 1);
  const dataFiles = await loadDataFiles(em, doc, workspaceId);
  const task: AnalysisTask = {
    document: doc,
    ...(dataFiles ? { dataFiles } : {}),
    want: 'answer',
    traces,
    ...(nodes ? { nodes } : {}),
    ...(packing !== 'plain' ? { packing } : {}),
    plan,
    ...(modes.allModes ? { allModes: true } : modes.mode ? { mode: modes.mode } : {}),
    ...(modes.figures ? { figures: modes.figures } : {}),
    encoding: answerEncoding(req),
  };
  const { outcome, source } = wantsFresh(req)
    ? { outcome: await runOnPool(task), source: 'computed' as const }
    : await cachedOutcome(currentUser(req).id, task, () => runOnPool(task));
  res.set('x-analysis-answer', source);
  if (outcome.kind === 'refused') {
    throw new HttpError(422, 'invalid-chain', outcome.message, outcome.details);
  }
  if (outcome.kind !== 'answer') throw new Error(`analysis thread answered ${outcome.kind}`);
  sendAnswer(res, outcome);
}

/**
 * POST /api/analysis and GET /api/catalogue: any signed-in user; with a `workspaceId`, a
 * member of that workspace.
 */
export function analysisRouter(em: EntityManager): Router {
  const router = Router();
  // The catalogue changes only with a deploy: build its JSON once.
  const catalogueJson = JSON.stringify(catalogue());
  // requireUser per route: this router sits at /api, where a router-wide guard would
  // answer 401 for unknown paths that deserve a 404.
  router.post('/analysis', requireUser, async (req, res) => {
    const body = parseOr422(analysisRequestSchema, req.body);
    if (body.workspaceId) await assertCanRead(em, currentUser(req), body.workspaceId);
    const traces = body.sweep ? (body.traces ?? PLOTTED_TRACES) : [];
    await analyze(
      em,
      req,
      res,
      body.document,
      traces,
      body.nodes,
      body.workspaceId,
      body.plan,
      {
        ...(body.mode ? { mode: body.mode } : {}),
        allModes: body.allModes,
        ...(body.figures ? { figures: body.figures } : {}),
      },
      body.sweepPacking,
    );
  });
  router.get('/catalogue', requireUser, (_req, res) => {
    res.type('application/json').send(catalogueJson);
  });
  return router;
}

const tracesQuery = z.object({ traces: sweepTracesQuerySchema });
const modesQuery = z.object({
  mode: analysisRequestSchema.shape.mode,
  modes: z.literal('all', { error: 'modes takes only "all" (every mode\'s analysis)' }).optional(),
  packing: sweepPackingSchema.default('plain'),
});

/**
 * GET /api/chains/:id/analysis?sweep=1&traces=stepUp,zIn&mode=transmit (or &modes=all;
 * &packing=differences for the smaller sweep columns): the stored chain, for viewers and up.
 */
export function chainAnalysisRouter(em: EntityManager): Router {
  const router = Router();
  router.get('/:id/analysis', chainRoleInOneQuery(em, 'viewer'), async (req, res) => {
    const sweep = req.query.sweep === '1' || req.query.sweep === 'true';
    const plan =
      req.query.plan === 'full' ? 'full' : req.query.plan === '1' || req.query.plan === 'true';
    const traces =
      req.query.traces === undefined
        ? PLOTTED_TRACES
        : parseOr422(tracesQuery, { traces: req.query.traces }, 'query').traces;
    const query = parseOr422(
      modesQuery,
      { mode: req.query.mode, modes: req.query.modes, packing: req.query.packing },
      'query',
    );
    const chain = res.locals.chain!;
    await analyze(
      em,
      req,
      res,
      storedDocument(chain.document),
      sweep ? traces : [],
      undefined,
      chain.workspace.id,
      plan,
      { ...(query.mode ? { mode: query.mode } : {}), allModes: query.modes === 'all' },
      query.packing,
    );
  });
  return router;
}
