import type { AnalysisResult } from '../../../shared/engine/types';
import type { ChainDocument } from '../../../shared/schema/chain';
import { analyzeChain } from '../../../shared/engine';

/**
 * What the engine says about `doc` with no sweep, or null when the engine refuses it. Tests compare the server's answers with this rather than with fixed numbers,
 * because the engine's figures are not the server's to pin down.
 */
export function analyzeChainForTest(doc: ChainDocument, figures?: number): AnalysisResult | null {
  try {
    return analyzeChain(doc, { sweep: false, ...(figures === undefined ? {} : { figures }) });
  } catch {
    return null;
  }
}
