/**
 * POST /api/design/*: the design assistants (tune, tune the pair, match here, snap to a
 * preferred series, parts with coil turns) on a chain document the client sends, with the
 * data files of `workspaceId`. Any signed-in user; with a workspace, a member of it. They
 * change nothing stored: the client applies an answer as an edit of its own.
 *
 * Each runs on the analysis thread pool (server/analysis/analysis-pool.ts) under the same
 * budgets as an analysis: a chain over the stages × points budget is refused with 422 before
 * any work, and one that runs out of time is stopped with 503; the event loop only parses,
 * authorises and sends.
 */
import { Router, type Request, type Response } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { z } from 'zod';
import type { ChainDocument } from '../../shared/schema/chain';
import {
  matchHereRequestSchema,
  partsRequestSchema,
  snapRequestSchema,
  tuneCandidatesRequestSchema,
  tunePairRequestSchema,
  tuneRequestSchema,
} from '../../shared/schema/api';
import { assertWithinBudget, runOnPool } from '../analysis/analysis-pool';
import { HttpError } from '../common/errors';
import { currentUser, requireUser } from '../common/roles';
import { parseOr422 } from '../common/validate';
import { assertCanRead, loadDataFiles } from '../files/data-files';
import type { DesignOp } from './design-ops';

/** What every design request carries besides its operation's own fields. */
type DesignBody = { document: ChainDocument; workspaceId?: string; figures?: number };

/**
 * Parses the body, checks workspace access and the budget, loads the data files, runs
 * design operation `op` on the pool and sends its answer; the engine's refusal of the chain
 * (a ChainValidationError or StageParameterError in the thread) is a 422 `invalid-chain`.
 */
async function runDesign(
  em: EntityManager,
  req: Request,
  res: Response,
  schema: z.ZodType<DesignBody>,
  op: DesignOp,
): Promise<void> {
  const body = parseOr422(schema, req.body);
  if (body.workspaceId) await assertCanRead(em, currentUser(req), body.workspaceId);
  assertWithinBudget(body.document);
  const dataFiles = await loadDataFiles(em, body.document, body.workspaceId);
  const { document, figures, ...request } = body;
  const outcome = await runOnPool({
    document,
    ...(figures ? { figures } : {}),
    ...(dataFiles ? { dataFiles } : {}),
    want: 'design',
    op,
    request,
    traces: [],
  });
  if (outcome.kind === 'refused') {
    throw new HttpError(422, outcome.code ?? 'invalid-chain', outcome.message, outcome.details);
  }
  if (outcome.kind !== 'json') throw new Error(`design thread answered ${outcome.kind}`);
  res.type('application/json').send(outcome.json);
}

export function designRouter(em: EntityManager): Router {
  const router = Router();
  router.use(requireUser);
  const routes: [string, z.ZodType<DesignBody>, DesignOp][] = [
    ['/tune/candidates', tuneCandidatesRequestSchema, 'tune/candidates'],
    ['/tune', tuneRequestSchema, 'tune'],
    ['/tune-pair', tunePairRequestSchema, 'tune-pair'],
    ['/match-here', matchHereRequestSchema, 'match-here'],
    ['/snap', snapRequestSchema, 'snap'],
    ['/parts', partsRequestSchema, 'parts'],
  ];
  for (const [path, schema, op] of routes) {
    router.post(path, (req, res) => runDesign(em, req, res, schema, op));
  }
  return router;
}
