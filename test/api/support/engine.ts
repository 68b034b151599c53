import type { AnalysisResult } from '../../../shared/engine/types';
import type { ChainDocument } from '../../../shared/schema/chain';
import { loadEngine } from '../../../server/analysis/engine';

/**
 * What the engine says about `doc` with no sweep, or null when the engine refuses it (or is
 * missing). Tests compare the server's answers with this rather than with fixed numbers,
 * because the engine's figures are not the server's to pin down.
 */
export async function analyzeChainForTest(doc: ChainDocument): Promise<AnalysisResult | null> {
  const engine = await loadEngine();
  if (!engine) return null;
  try {
    return await engine.analyzeChain(doc, { sweep: false });
  } catch {
    return null;
  }
}
