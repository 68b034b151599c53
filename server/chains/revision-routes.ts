import { Router } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import { restoreRevisionSchema } from '../../shared/schema/api';
import { NotFoundError } from '../common/errors';
import { access, chainRole, currentUser } from '../common/roles';
import { parseOr422 } from '../common/validate';
import { saveChainVersion } from './chain-store';
import { toChainDto, toRevisionDto, toRevisionSummaryDto } from './dto';
import { ChainRevisionSchema } from './revision.entity';
import { chainChanged } from '../activity/chain-events';

/** Reads a revision number from the path; anything but a positive integer names nothing. */
function versionParam(raw: unknown): number {
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 1)
    throw new NotFoundError(`no revision "${String(raw)}": revisions are numbered 1, 2, ...`);
  return n;
}

/** /api/chains/:id/revisions: history, one revision, restore. Mounted inside chainsRouter. */
export function revisionRoutes(em: EntityManager): Router {
  const router = Router({ mergeParams: true });

  const findRevision = async (chainId: string, version: number) => {
    const revision = await em.findOne(
      ChainRevisionSchema,
      { chain: chainId, version },
      { populate: ['author'] },
    );
    if (!revision) throw new NotFoundError(`this chain has no revision ${version}`);
    return revision;
  };

  router.get('/', chainRole(em, 'viewer'), async (_req, res) => {
    const revisions = await em.find(
      ChainRevisionSchema,
      { chain: res.locals.chain!.id },
      // The list leaves the documents out: they can be large, and one is fetched on demand.
      { populate: ['author'], exclude: ['document'], orderBy: { version: 'desc' } },
    );
    res.json(revisions.map(toRevisionSummaryDto));
  });

  router.get('/:version', chainRole(em, 'viewer'), async (req, res) => {
    res.json(
      toRevisionDto(await findRevision(res.locals.chain!.id, versionParam(req.params.version))),
    );
  });

  // Restoring never rewrites history: it saves the old document as a new version. The body's
  // `version` is the chain version the client last read, checked like any save.
  router.post('/:version/restore', chainRole(em, 'editor'), async (req, res) => {
    const body = parseOr422(restoreRevisionSchema, req.body);
    const chain = res.locals.chain!;
    const revision = await findRevision(chain.id, versionParam(req.params.version));
    const saved = await saveChainVersion(em, chain, {
      expectedVersion: body.version,
      document: revision.document,
      user: currentUser(req),
      message: `Restored revision ${revision.version}`,
    });
    await chainChanged(em, { chain: saved, user: currentUser(req), kind: 'chain-restored' });
    res.json(toChainDto(saved, access(res).role));
  });

  return router;
}
