import type { ChainDocument } from '../../shared/schema/chain';
import { ChainDocumentError, parseChainDocument } from '../../shared/schema/parse-chain';
import { HttpError } from '../common/errors';

/**
 * A chain document read back from the database, parsed by today's chain schema before the
 * engine sees it: the engine takes parsed documents only, and a field the schema gained since
 * the chain was saved (a new threshold, say) gets its default here. A request body was parsed
 * by its route already; only stored documents come through here.
 * @throws HttpError 422 `invalid-chain` naming each field today's schema refuses
 */
export function storedDocument(doc: ChainDocument): ChainDocument {
  try {
    return parseChainDocument(doc, 'the saved chain');
  } catch (err) {
    if (!(err instanceof ChainDocumentError)) throw err;
    throw new HttpError(422, 'invalid-chain', err.message, err.problems);
  }
}
