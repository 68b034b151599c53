/**
 * Validation without analysis (for editors and the API): builds the chain and returns the
 * issues instead of throwing.
 */
import { ChainValidationError, type ChainIssue } from './errors';
import type { StageDefinition } from './types';
import { buildChain, type BuildOptions, type ChainLike } from './core/build';
import { defaultCatalogue } from './default-catalogue';

/** Every problem of a chain; empty when it can be analysed. */
export function validateChain(
  doc: ChainLike,
  catalogue?: readonly StageDefinition[],
  options: BuildOptions = {},
): ChainIssue[] {
  try {
    buildChain(doc, catalogue ?? defaultCatalogue(), options);
    return [];
  } catch (e) {
    if (e instanceof ChainValidationError) return e.issues;
    throw e;
  }
}
