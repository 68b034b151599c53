/**
 * Variable values marked on the chain (`settings.variables`) and the gangs they form: what
 * band studies and the receiver plan's spur chart turn when they tune the chain across a
 * band. A gang turns its members together, linearly in value from minimum to maximum over
 * the dial (a straight-line capacitance gang, as the band study does).
 */
import { MAIN_GANG, type VariableMark } from '../schema/chain';
import { formatEngineering } from '../units/format';
import type { UnitKind } from './types';

/** A gang's member: the value it turns and its range. */
export interface GangMemberRef {
  stageId: string;
  key: string;
  min: number;
  max: number;
}

interface WithVariables {
  settings: { variables?: readonly VariableMark[] };
  stages: readonly { id: string }[];
}

/** The gang groups marked on the chain, in the order first marked. */
export function gangGroups(doc: WithVariables): string[] {
  const out: string[] = [];
  for (const m of doc.settings.variables ?? []) {
    const g = m.gang ?? MAIN_GANG;
    if (!out.includes(g)) out.push(g);
  }
  return out;
}

/**
 * The members of gang `group` (default: the first group marked), leaving out marks whose
 * stage is no longer in the chain.
 */
export function gangMembers(doc: WithVariables, group?: string): GangMemberRef[] {
  const g = group ?? gangGroups(doc)[0];
  const ids = new Set(doc.stages.map((s) => s.id));
  return (doc.settings.variables ?? [])
    .filter((m) => (m.gang ?? MAIN_GANG) === g && ids.has(m.stageId))
    .map(({ stageId, key, min, max }) => ({ stageId, key, min, max }));
}

/** Each member's value at dial setting 0…1 (0: every member at its minimum). */
export function gangValues(members: readonly GangMemberRef[], dial: number) {
  return members.map((m) => ({ stageId: m.stageId, key: m.key, value: m.min + dial * (m.max - m.min) })); // prettier-ignore
}

/**
 * How a chart or study names the gang it turned, e.g. `preselector.c 50 pF…400 pF`;
 * `unitOf` gives each member's unit (from the stage catalogue).
 */
export function describeGang(
  members: readonly GangMemberRef[],
  unitOf: (m: GangMemberRef) => UnitKind,
): string {
  return members
    .map((m) => {
      const unit = unitOf(m);
      return `${m.stageId}.${m.key} ${formatEngineering(m.min, unit)}…${formatEngineering(m.max, unit)}`; // prettier-ignore
    })
    .join(', ');
}
