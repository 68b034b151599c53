import { Router, type Response } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import { analysisRequestSchema } from '../../shared/schema/api';
import type { ChainDocument } from '../../shared/schema/chain';
import { chainRole, currentUser, requireUser } from '../common/roles';
import { assertCanRead, loadDataFiles } from '../files/data-files';
import { parseOr422 } from '../common/validate';
import { loadEngine, type EngineApi } from './engine';
import { EngineUnavailableError, invalidChainError } from './engine-errors';

async function engineOr503(): Promise<EngineApi> {
  const engine = await loadEngine();
  if (!engine) throw new EngineUnavailableError();
  return engine;
}

/**
 * Runs the engine with the data files the stages refer to (from `workspaceId` only) and maps
 * its validation errors to 422 with the issues as details.
 */
async function analyze(
  em: EntityManager,
  res: Response,
  doc: ChainDocument,
  sweep: boolean,
  workspaceId: string | undefined,
  plan: boolean | 'full' = false,
) {
  const engine = await engineOr503();
  const dataFiles = await loadDataFiles(em, doc, workspaceId);
  try {
    res.json(await engine.analyzeChain(doc, { sweep, plan, ...(dataFiles ? { dataFiles } : {}) }));
  } catch (err) {
    throw invalidChainError(err) ?? err;
  }
}

/**
 * POST /api/analysis and GET /api/catalogue: any signed-in user; with a `workspaceId`, a
 * member of that workspace.
 */
export function analysisRouter(em: EntityManager): Router {
  const router = Router();
  // requireUser per route: this router sits at /api, where a router-wide guard would
  // answer 401 for unknown paths that deserve a 404.
  router.post('/analysis', requireUser, async (req, res) => {
    const body = parseOr422(analysisRequestSchema, req.body);
    if (body.workspaceId) await assertCanRead(em, currentUser(req), body.workspaceId);
    await analyze(em, res, body.document, body.sweep, body.workspaceId, body.plan);
  });
  router.get('/catalogue', requireUser, async (_req, res) => {
    res.json((await engineOr503()).catalogue());
  });
  return router;
}

/** GET /api/chains/:id/analysis?sweep=1: the stored chain, for viewers and up. */
export function chainAnalysisRouter(em: EntityManager): Router {
  const router = Router();
  router.get('/:id/analysis', chainRole(em, 'viewer'), async (req, res) => {
    const sweep = req.query.sweep === '1' || req.query.sweep === 'true';
    const plan =
      req.query.plan === 'full' ? 'full' : req.query.plan === '1' || req.query.plan === 'true';
    const chain = res.locals.chain!;
    await analyze(em, res, chain.document, sweep, chain.workspace.id, plan);
  });
  return router;
}
