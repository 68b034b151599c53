import { Router, type Request } from 'express';
import {
  createShareLinkSchema,
  exportQuerySchema,
  sendChainSchema,
  sharedChainQuerySchema,
  type SharedChainDto,
  type ShareLinkDto,
} from '../../shared/schema/api';
import type { ChainDocument } from '../../shared/schema/chain';
import { recordActivity } from '../activity/record';
import { catalogue } from '../../shared/engine';
import {
  AnalysisTooLargeError,
  analysisLimits,
  runOnPool,
  withinBudget,
} from '../analysis/analysis-pool';
import { sendExport } from '../analysis/export-routes';
import { looksLikeToken, hashToken, newToken, tokenMatches } from '../auth/tokens';
import { storedDocument } from '../chains/stored-document';
import { HttpError, NotFoundError } from '../common/errors';
import { chainRole, currentUser, loadedChain, uuidParam } from '../common/roles';
import type { Services } from '../common/services';
import { parseOr422 } from '../common/validate';
import { publicBaseUrl } from '../config';
import { loadDataFiles } from '../files/data-files';
import { messages } from '../mail/messages';
import { ShareLinkSchema, type ShareLink } from './share-link.entity';

function toShareLinkDto(link: ShareLink, url?: string): ShareLinkDto {
  return {
    id: link.id,
    ...(url ? { url } : {}),
    createdBy: link.createdBy.displayName,
    createdAt: link.createdAt.toISOString(),
    expiresAt: link.expiresAt?.toISOString() ?? null,
  };
}

/** /api/chains/:id/share-links (editors make and revoke them) and /api/chains/:id/send. */
export function chainSharingRouter(services: Services): Router {
  const router = Router();
  const { em } = services;
  const base = publicBaseUrl(services.config);

  router.get('/:id/share-links', chainRole(em, 'editor'), async (_req, res) => {
    const links = await em.find(
      ShareLinkSchema,
      {
        chain: loadedChain(res).id,
        revokedAt: null,
        $or: [{ expiresAt: null }, { expiresAt: { $gt: new Date() } }],
      },
      { populate: ['createdBy'], orderBy: { createdAt: 'desc' } },
    );
    res.json(links.map((l) => toShareLinkDto(l)));
  });

  router.post('/:id/share-links', chainRole(em, 'editor'), async (req, res) => {
    const body = parseOr422(createShareLinkSchema, req.body ?? {});
    const chain = loadedChain(res);
    const user = currentUser(req);
    const { token, hash } = newToken();
    const link = em.create(ShareLinkSchema, {
      chain,
      tokenHash: hash,
      createdBy: user,
      expiresAt: body.expiresInDays
        ? new Date(Date.now() + body.expiresInDays * 24 * 3600_000)
        : null,
    });
    recordActivity(em, {
      workspaceId: chain.workspace.id,
      actor: user,
      kind: 'chain-shared',
      summary: `made a read-only link to "${chain.name}"${body.expiresInDays ? ` for ${body.expiresInDays} days` : ''}`,
      chainId: chain.id,
    });
    await em.flush();
    res.status(201).json(toShareLinkDto(link, `${base}/shared/${token}`));
  });

  router.delete('/:id/share-links/:linkId', chainRole(em, 'editor'), async (req, res) => {
    const revoked = await em.nativeUpdate(
      ShareLinkSchema,
      { id: uuidParam(req, 'linkId', 'link'), chain: loadedChain(res).id, revokedAt: null },
      { revokedAt: new Date() },
    );
    if (!revoked) throw new NotFoundError('this chain has no such live link');
    res.status(204).end();
  });

  // "Send to a colleague": a link to the chain in the app (they sign in to open it).
  router.post('/:id/send', chainRole(em, 'viewer'), async (req, res) => {
    const body = parseOr422(sendChainSchema, req.body);
    const chain = loadedChain(res);
    const user = currentUser(req);
    recordActivity(em, {
      workspaceId: chain.workspace.id,
      actor: user,
      kind: 'chain-sent',
      summary: `sent "${chain.name}" to ${body.email}`,
      chainId: chain.id,
    });
    await em.flush();
    const mail = await services.mail.send(
      em,
      messages.chainLink(body.email, {
        by: user.displayName,
        chain: chain.name,
        note: body.note,
        url: `${base}/w/${chain.workspace.id}/chains/${chain.id}`,
      }),
    );
    res.status(202).json({ mail });
  });

  return router;
}

/** /api/shared/:token: the chain behind a read-only link, for anyone holding it. Reads only. */
export function sharedRouter(services: Services): Router {
  const router = Router();
  const { em } = services;

  const linkOf = async (req: Request): Promise<ShareLink> => {
    const token = req.params.token;
    const gone = new NotFoundError(
      'this link does not work (it was withdrawn, has expired or was mistyped); ask for a new one',
    );
    if (!looksLikeToken(token)) throw gone;
    const link = await em.findOne(
      ShareLinkSchema,
      { tokenHash: hashToken(token) },
      { populate: ['chain', 'chain.workspace'] },
    );
    if (!link || !tokenMatches(token, link.tokenHash) || link.revokedAt) throw gone;
    if (link.expiresAt && link.expiresAt <= new Date()) throw gone;
    return link;
  };

  router.get('/:token', async (req, res) => {
    const chain = (await linkOf(req)).chain;
    // The reader's significant figures, for the flag sentences (absent: the engine's own).
    const { figures: digits } = parseOr422(sharedChainQuerySchema, req.query, 'query');
    const dataFiles = await loadDataFiles(em, chain.document, chain.workspace.id);
    // The analyses (the chain's, and each mode's) run on the thread pool under the analysis
    // budgets; a chain over them or one the engine refuses is still shown, with the reason
    // in place of its figures.
    let figures = '{"analysis":null}';
    let analysisError: string | undefined;
    let doc: ChainDocument | null = null;
    try {
      doc = storedDocument(chain.document);
    } catch (err) {
      if (!(err instanceof HttpError)) throw err;
      analysisError = err.message; // today's schema refuses it: shown as saved, no figures
    }
    const runs = 1 + (doc?.modes?.length ?? 0);
    if (!doc) {
      // analysisError says why
    } else if (!withinBudget(doc, runs)) {
      const { maxStagePoints } = analysisLimits();
      analysisError = new AnalysisTooLargeError(doc.stages.length * runs, doc.settings.sweep.points, maxStagePoints).message; // prettier-ignore
    } else {
      const outcome = await runOnPool({
        document: doc,
        ...(dataFiles ? { dataFiles } : {}),
        want: 'shared',
        traces: [], // unused: a shared link's result carries the whole sweep
        ...(digits ? { figures: digits } : {}),
      });
      if (outcome.kind !== 'json') throw new Error(`analysis thread answered ${outcome.kind}`);
      figures = outcome.json;
    }
    const body: Omit<SharedChainDto, 'analysis' | 'modes'> = {
      name: chain.name,
      description: chain.description,
      version: chain.version,
      updatedAt: chain.updatedAt.toISOString(),
      workspaceName: chain.workspace.name,
      document: chain.document,
      ...(analysisError ? { analysisError } : {}),
    };
    // The thread serialised the figures (`analysis`, with `analysisError` or `modes`): put
    // them in as text rather than parse them back.
    const rest = JSON.stringify(body);
    res
      .set('Cache-Control', 'no-store')
      .type('application/json')
      .send(`${figures.slice(0, -1)},${rest.slice(1)}`);
  });

  // The catalogue entries of the chain's stage types, so a signed-out reader sees each
  // value under its name and unit ("Inductance 22 µH", not "l 2.2e-5").
  router.get('/:token/catalogue', async (req, res) => {
    const chain = (await linkOf(req)).chain;
    const used = new Set(chain.document.stages.map((s) => s.type));
    res.set('Cache-Control', 'no-store').json(catalogue().filter((t) => used.has(t.type)));
  });

  router.get('/:token/export', async (req, res) => {
    const chain = (await linkOf(req)).chain;
    const query = parseOr422(exportQuerySchema, req.query, 'query');
    await sendExport(em, res, storedDocument(chain.document), query.format, {
      z0: query.z0,
      workspaceId: chain.workspace.id,
      modeId: query.mode,
      version: query.version,
    });
  });

  return router;
}
