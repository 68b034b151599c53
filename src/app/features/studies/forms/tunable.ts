import { effect, untracked } from '@angular/core';
import type { ChainDocument } from '../../../../../shared/schema/chain';

/** A stage with capacitance or inductance values a study can turn. */
export interface TunableStage {
  id: string;
  label: string;
  keys: string[];
}

/** Keys of the catalogue's capacitances and inductances that studies offer. */
const REACTIVE_KEY = /^(c|l|cc|l1|l2|c1|c2|ct|cp)$/;

/** Stages with a numeric capacitance or inductance, for gangs and the optimiser. */
export function tunableStages(doc: ChainDocument | undefined): TunableStage[] {
  return (doc?.stages ?? [])
    .map((s) => ({
      id: s.id,
      label: s.label || s.id,
      keys: Object.keys(s.values).filter(
        (k) => typeof s.values[k] === 'number' && REACTIVE_KEY.test(k),
      ),
    }))
    .filter((s) => s.keys.length > 0);
}

/** The unit of a reactive key: capacitances start with c, inductances with l. */
export function unitOfKey(key: string): 'henry' | 'farad' {
  return key.startsWith('l') ? 'henry' : 'farad';
}

export const numberOf = (e: Event) => Number((e.target as HTMLInputElement).value);
export const textOf = (e: Event) => (e.target as HTMLInputElement | HTMLSelectElement).value;

/**
 * Calls `fill` with the chain once it has loaded, not on every later change (a study form's
 * starting values). Call it in an injection context (a constructor).
 */
export function fillOnceLoaded(
  document: () => ChainDocument | undefined,
  fill: (doc: ChainDocument) => void,
): void {
  let filled = false;
  effect(() => {
    const doc = document();
    if (doc && !filled) {
      filled = true;
      untracked(() => fill(doc));
    }
  });
}
