/**
 * The stage catalogue. A new stage type is one new definition added here.
 */
import type { StageDefinition } from '../types';
import { LUMPED_ELEMENT, SERIES_LC, SHUNT_LC_TANK } from './lumped';

/** Every stage type, in palette order. Types are unique (tested). */
export const STAGE_DEFINITIONS: StageDefinition[] = [LUMPED_ELEMENT, SERIES_LC, SHUNT_LC_TANK];

/** The definition of a type, or undefined. */
export function findStageDefinition(type: string): StageDefinition | undefined {
  return STAGE_DEFINITIONS.find((d) => d.type === type);
}
