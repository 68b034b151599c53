/**
 * The product's stage catalogue as the engine's default. Kept in its own file so the core
 * never depends on the stage modules and tests can pass their own definitions.
 */
import type { StageDefinition } from './types';

/** The default stage definitions, or null while no catalogue is installed. */
export function defaultCatalogue(): readonly StageDefinition[] | null {
  return null;
}
