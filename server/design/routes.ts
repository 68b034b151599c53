/**
 * POST /api/design/*: the design assistants (tune, tune the pair, match here, snap to a
 * preferred series, parts with coil turns) on a chain document the client sends, with the
 * data files of `workspaceId`. Any signed-in user; with a workspace, a member of it. They
 * change nothing stored: the client applies an answer as an edit of its own.
 */
import { Router, type Request } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { z } from 'zod';
import {
  matchHereRequestSchema,
  partsRequestSchema,
  snapRequestSchema,
  tuneCandidatesRequestSchema,
  tunePairRequestSchema,
  tuneRequestSchema,
} from '../../shared/schema/api';
import { currentUser, requireUser } from '../common/roles';
import { parseOr422 } from '../common/validate';
import { assertCanRead, loadDataFiles } from '../files/data-files';
import { invalidChainError } from '../analysis/engine-errors';
import * as designApi from '../../shared/engine/design';

type DesignApi = typeof designApi;
type DesignOptions = designApi.DesignOptions;

/**
 * Parses the body, checks workspace access, loads the data files and runs `work`, mapping
 * the engine's refusals (ChainValidationError, StageParameterError) to 422.
 */
async function runDesign<S extends z.ZodType<{ document: unknown; workspaceId?: string }>, T>(
  em: EntityManager,
  req: Request,
  schema: S,
  work: (design: DesignApi, body: z.infer<S>, options: DesignOptions) => T,
): Promise<T> {
  const body = parseOr422(schema, req.body);
  if (body.workspaceId) await assertCanRead(em, currentUser(req), body.workspaceId);
  const dataFiles = await loadDataFiles(em, body.document as never, body.workspaceId);
  try {
    return work(designApi, body, dataFiles ? { dataFiles } : {});
  } catch (err) {
    throw invalidChainError(err) ?? err;
  }
}

export function designRouter(em: EntityManager): Router {
  const router = Router();
  router.use(requireUser);
  router.post('/tune/candidates', async (req, res) => {
    res.json(
      await runDesign(em, req, tuneCandidatesRequestSchema, (d, b, o) =>
        d.tuneCandidates(b.document, b.resonator, o),
      ),
    );
  });
  router.post('/tune', async (req, res) => {
    res.json(
      await runDesign(em, req, tuneRequestSchema, (d, b, o) =>
        d.tuneResonator(
          b.document,
          {
            resonator: b.resonator,
            element: b.element,
            targetHz: b.targetHz,
            peakNode: b.peakNode,
          },
          o,
        ),
      ),
    );
  });
  router.post('/tune-pair', async (req, res) => {
    res.json(
      await runDesign(em, req, tunePairRequestSchema, (d, b, o) => {
        const { document: _doc, workspaceId: _w, ...request } = b;
        return d.tunePair(b.document, request, o);
      }),
    );
  });
  router.post('/match-here', async (req, res) => {
    res.json(
      await runDesign(em, req, matchHereRequestSchema, (d, b, o) => {
        const { document: _doc, workspaceId: _w, ...request } = b;
        return d.matchHere(b.document, request, o);
      }),
    );
  });
  router.post('/snap', async (req, res) => {
    res.json(
      await runDesign(em, req, snapRequestSchema, (d, b, o) =>
        d.snapChain(b.document, { series: b.series, stageId: b.stageId }, o),
      ),
    );
  });
  router.post('/parts', async (req, res) => {
    res.json(
      await runDesign(em, req, partsRequestSchema, (d, b, o) => {
        const stage = d.stageOf(b.document, b.stageId);
        const form = b.coilForm ?? d.DEFAULT_COIL_FORM;
        const rows = d.stageParts(stage, form, o);
        return { stageId: stage.id, rows, csv: d.stagePartsCsv(stage, rows, form) };
      }),
    );
  });
  return router;
}
