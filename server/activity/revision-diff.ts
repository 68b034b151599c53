import { Router } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import { diffQuerySchema, type RevisionDiffDto } from '../../shared/schema/api';
import type { ChainDocument } from '../../shared/schema/chain';
import { diffChains, keyFigures, type FigureSource } from '../../shared/diff/chain-diff';
import { analyzeChain, catalogue as stageCatalogue } from '../../shared/engine';
import { invalidChainError } from '../analysis/engine-errors';
import { ChainRevisionSchema } from '../chains/revision.entity';
import { NotFoundError } from '../common/errors';
import { chainRole, loadedChain } from '../common/roles';
import { parseOr422 } from '../common/validate';
import { loadDataFiles } from '../files/data-files';

/** GET /api/chains/:id/diff?from=&to=: what changed between two revisions (viewers and up). */
export function revisionDiffRouter(em: EntityManager): Router {
  const router = Router();
  router.get('/:id/diff', chainRole(em, 'viewer'), async (req, res) => {
    const q = parseOr422(diffQuerySchema, req.query, 'query');
    const chain = loadedChain(res);
    const revisions = await em.find(ChainRevisionSchema, {
      chain: chain.id,
      version: { $in: [q.from, q.to] },
    });
    const docOf = (v: number) => {
      const r = revisions.find((x) => x.version === v);
      if (!r) throw new NotFoundError(`this chain has no revision ${v}`);
      return r.document;
    };
    const before = docOf(q.from);
    const after = docOf(q.to);
    const catalogue = stageCatalogue();
    const analyze = async (doc: ChainDocument): Promise<FigureSource | null> => {
      const dataFiles = await loadDataFiles(em, doc, chain.workspace.id).catch(() => undefined);
      try {
        return (await analyzeChain(doc, {
          sweep: false,
          ...(dataFiles ? { dataFiles } : {}),
        })) as FigureSource;
      } catch (err) {
        // A revision the engine refuses still diffs; its figures show as missing.
        if (invalidChainError(err)) return null;
        throw err;
      }
    };
    const body: RevisionDiffDto = {
      from: q.from,
      to: q.to,
      ...diffChains(before, after, (type) => catalogue.find((t) => t.type === type)?.params ?? []),
      figures: keyFigures(await analyze(before), await analyze(after)),
    };
    res.json(body);
  });
  return router;
}
