/**
 * Pure helpers for the order of stages in a chain. The source stays first and the load
 * last; every helper returns a new array and never mutates its input, so a signal
 * `update` can hand its result straight back.
 */
import { moveItemInArray } from '@angular/cdk/drag-drop';
import type { StageInstance } from '../../../../../shared/schema/chain';

export type StageRole = 'source' | 'two-port' | 'load';
export type RoleOf = (stage: StageInstance) => StageRole;

export type OrderChange =
  { ok: true; stages: StageInstance[]; note?: string } | { ok: false; reason: string };

/**
 * Moves one item, clamping both indices into the list: a copy goes through
 * `moveItemInArray`, and the copy is returned.
 */
export function moveImmutably<T>(items: readonly T[], from: number, to: number): T[] {
  const copy = [...items];
  if (copy.length === 0) return copy;
  moveItemInArray(copy, clamp(from, copy.length - 1), clamp(to, copy.length - 1));
  return copy;
}

/** Index range two-ports may occupy: after the source, before the load. */
function twoPortBounds(stages: readonly StageInstance[], roleOf: RoleOf): [number, number] {
  const first = stages.length > 0 && roleOf(stages[0]) === 'source' ? 1 : 0;
  const hasLoad = stages.length > 0 && roleOf(stages[stages.length - 1]) === 'load';
  return [first, hasLoad ? stages.length - 1 : stages.length];
}

/** Reorders a stage; refuses moves that would take the source or the load off its end. */
export function moveStage(
  stages: readonly StageInstance[],
  roleOf: RoleOf,
  from: number,
  to: number,
): OrderChange {
  if (from < 0 || from >= stages.length) return { ok: false, reason: 'There is no stage there.' };
  const role = roleOf(stages[from]);
  if (from === to) return { ok: true, stages: [...stages] };
  if (role === 'source')
    return { ok: false, reason: 'The source always stays first in the chain.' };
  if (role === 'load') return { ok: false, reason: 'The load always stays last in the chain.' };
  const [low, high] = twoPortBounds(stages, roleOf);
  // While moving, the item itself is out of the list, so the last free slot is high - 1.
  if (to < low) return { ok: false, reason: 'Stages go after the source: the source stays first.' };
  if (to > high - 1)
    return { ok: false, reason: 'Stages go before the load: the load stays last.' };
  return { ok: true, stages: moveImmutably(stages, from, to) };
}

/**
 * Inserts a new stage at `index`. A source replaces the current source and a load
 * replaces the current load (wherever it was dropped): a chain has exactly one of each.
 */
export function insertStage(
  stages: readonly StageInstance[],
  roleOf: RoleOf,
  stage: StageInstance,
  index: number,
): OrderChange {
  const role = roleOf(stage);
  if (role === 'source') {
    const hasSource = stages.length > 0 && roleOf(stages[0]) === 'source';
    const rest = hasSource ? stages.slice(1) : [...stages];
    return { ok: true, stages: [stage, ...rest], note: hasSource ? 'replaced-source' : undefined };
  }
  if (role === 'load') {
    const last = stages.length - 1;
    const hasLoad = last >= 0 && roleOf(stages[last]) === 'load';
    const rest = hasLoad ? stages.slice(0, last) : [...stages];
    return { ok: true, stages: [...rest, stage], note: hasLoad ? 'replaced-load' : undefined };
  }
  const [low, high] = twoPortBounds(stages, roleOf);
  if (index < low)
    return { ok: false, reason: 'Stages go after the source: the source stays first.' };
  if (index > high) return { ok: false, reason: 'Stages go before the load: the load stays last.' };
  return { ok: true, stages: [...stages.slice(0, index), stage, ...stages.slice(index)] };
}

/** Removes a stage; the source and the load can be replaced but not removed. */
export function removeStage(
  stages: readonly StageInstance[],
  roleOf: RoleOf,
  index: number,
): OrderChange {
  if (index < 0 || index >= stages.length) return { ok: false, reason: 'There is no stage there.' };
  const role = roleOf(stages[index]);
  if (role !== 'two-port') {
    return {
      ok: false,
      reason: `A chain needs a ${role}: drop another ${role} type from the palette to replace it.`,
    };
  }
  return { ok: true, stages: stages.filter((_, i) => i !== index) };
}

/** Copies a two-port stage right after itself, under a new id. */
export function duplicateStage(
  stages: readonly StageInstance[],
  roleOf: RoleOf,
  index: number,
  newId: string,
): OrderChange {
  if (index < 0 || index >= stages.length) return { ok: false, reason: 'There is no stage there.' };
  const original = stages[index];
  const role = roleOf(original);
  if (role !== 'two-port') return { ok: false, reason: `A chain has only one ${role}.` };
  // Stages are plain JSON, so a JSON round trip is a complete deep copy.
  const copy: StageInstance = JSON.parse(JSON.stringify({ ...original, id: newId }));
  copy.label = original.label ? `${original.label} (copy)` : '';
  return { ok: true, stages: [...stages.slice(0, index + 1), copy, ...stages.slice(index + 1)] };
}

function clamp(value: number, max: number): number {
  return Math.floor(Math.max(0, Math.min(max, value)));
}
