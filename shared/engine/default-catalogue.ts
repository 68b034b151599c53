/**
 * The product's stage catalogue as the engine's default. Kept in its own file so the core
 * modules never depend on the stage modules, and tests can pass their own definitions.
 */
import { STAGE_DEFINITIONS } from './stages';
import type { StageDefinition } from './types';

/** The default stage definitions (the product's catalogue). */
export function defaultCatalogue(): readonly StageDefinition[] {
  return STAGE_DEFINITIONS;
}
