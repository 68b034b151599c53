import type { EntityManager } from '@mikro-orm/postgresql';
import type { ChainDocument } from '../../shared/schema/chain';
import { HttpError } from '../common/errors';
import { loadDataFiles } from '../files/data-files';
import { runOnPool, withinBudget } from './analysis-pool';

/**
 * Flags of severity warning or error the engine finds in `doc` (no sweep), for the chain
 * list; null ("unknown") when the chain cannot be analysed: the engine refuses it, it is
 * over the analysis budget, a data file it needs is missing or unreadable, or the analysis
 * ran out of time. The save goes on either way (the schema validated the document).
 */
export async function countFlags(
  em: EntityManager,
  doc: ChainDocument,
  workspaceId: string,
): Promise<number | null> {
  if (!withinBudget(doc)) return null;
  try {
    const dataFiles = await loadDataFiles(em, doc, workspaceId);
    const outcome = await runOnPool({
      document: doc,
      ...(dataFiles ? { dataFiles } : {}),
      want: 'flag-count',
      traces: [],
    });
    return outcome.kind === 'flag-count' ? outcome.count : null;
  } catch (err) {
    // A refusal the client can act on (busy, timeout, bad data file) is not a fault.
    if (err instanceof HttpError) return null;
    console.error('[server] counting flags failed; the chain is saved with flags unknown:', err);
    return null;
  }
}
