/**
 * The stage catalogue as clients see it (definitions without their builders) and lookup by
 * type name.
 */
import type { StageDefinition, StageTypeInfo } from './types';
import { defaultCatalogue } from './default-catalogue';

/** Every stage type without its `build` function, ready to send as JSON. */
export function catalogue(defs?: readonly StageDefinition[]): StageTypeInfo[] {
  return (defs ?? defaultCatalogue()).map(({ build: _build, ...info }) => info);
}

/** The definition of a stage type, or undefined when the catalogue has no such type. */
export function getStageDefinition(
  type: string,
  defs?: readonly StageDefinition[],
): StageDefinition | undefined {
  return (defs ?? defaultCatalogue()).find((d) => d.type === type);
}
