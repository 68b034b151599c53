import { Router } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import { diffQuerySchema, type RevisionDiffDto } from '../../shared/schema/api';
import type { ChainDocument } from '../../shared/schema/chain';
import { diffChains, keyFigures, type FigureSource } from '../../shared/diff/chain-diff';
import { catalogue as stageCatalogue } from '../../shared/engine';
import { runOnPool, withinBudget } from '../analysis/analysis-pool';
import { ChainRevisionSchema } from '../chains/revision.entity';
import { storedDocument } from '../chains/stored-document';
import { HttpError, NotFoundError } from '../common/errors';
import { chainRole, loadedChain } from '../common/roles';
import { parseOr422 } from '../common/validate';
import { loadDataFiles } from '../files/data-files';

/**
 * GET /api/chains/:id/diff?from=&to=&figures=: what changed between two revisions (viewers
 * and up), its texts at the reader's significant figures (2..8).
 */
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
    // Each revision is analysed on the thread pool under the analysis budgets. A revision the
    // engine refuses, or one over the stages × points budget, still diffs: its figures show
    // as missing.
    const analyze = async (stored: ChainDocument): Promise<FigureSource | null> => {
      let doc: ChainDocument;
      try {
        doc = storedDocument(stored);
      } catch (err) {
        if (err instanceof HttpError) return null; // today's schema refuses it: no figures
        throw err;
      }
      if (!withinBudget(doc)) return null;
      const dataFiles = await loadDataFiles(em, doc, chain.workspace.id).catch(() => undefined);
      const outcome = await runOnPool({
        document: doc,
        ...(dataFiles ? { dataFiles } : {}),
        want: 'result',
        traces: [],
      });
      if (outcome.kind === 'refused') return null;
      if (outcome.kind !== 'json') throw new Error(`analysis thread answered ${outcome.kind}`);
      return JSON.parse(outcome.json) as FigureSource;
    };
    const body: RevisionDiffDto = {
      from: q.from,
      to: q.to,
      ...diffChains(
        before,
        after,
        (type) => catalogue.find((t) => t.type === type)?.params ?? [],
        q.figures,
      ),
      figures: keyFigures(...(await Promise.all([analyze(before), analyze(after)])), q.figures),
    };
    res.json(body);
  });
  return router;
}
