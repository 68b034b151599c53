/**
 * Validation without analysis (for editors and the API): builds the chain and returns the
 * issues instead of throwing.
 */
import { ChainValidationError, type ChainIssue } from './errors';
import type { StageDefinition } from './types';
import type { ChainDocument } from '../schema/chain';
import { buildChain, type BuildOptions } from './core/build';
import { defaultCatalogue } from './default-catalogue';
import { hasModes } from './modes/apply-mode';
import { modeValidationIssues } from './modes';

/** Every problem of a chain; empty when it can be analysed. */
export function validateChain(
  doc: ChainDocument,
  catalogue?: readonly StageDefinition[],
  options: BuildOptions = {},
): ChainIssue[] {
  // A chain with modes is valid when each mode is (unless one mode is asked for).
  if (hasModes(doc) && options.mode === undefined)
    return modeValidationIssues(doc, catalogue ?? defaultCatalogue(), options);
  try {
    buildChain(doc, catalogue ?? defaultCatalogue(), options);
    return [];
  } catch (e) {
    if (e instanceof ChainValidationError) return e.issues;
    throw e;
  }
}
