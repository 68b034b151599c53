import type { ChainDocument } from '../../../../../shared/schema/chain';
import { setOverride, withModes } from '../modes/mode-edits';
import type { ChainMode } from '../modes/mode-types';
import { withValue } from '../state/stage-factory';
import type { KnobQuestion } from './knob-messages';

/**
 * What the knob asks while stage `stageId`'s `key` turns to `value`: the chain as the results
 * on screen are read. In the mode shown the value is that mode's own, as the release writes
 * it; with no mode shown the chain is as written, without its modes.
 */
export function tunedChain(
  doc: ChainDocument,
  mode: ChainMode | null,
  stageId: string,
  key: string,
  value: number,
): Omit<KnobQuestion, 'id'> {
  if (mode) return { document: setOverride(doc, mode.id, stageId, key, value), mode: mode.id };
  const stages = doc.stages.map((s) => (s.id === stageId ? withValue(s, key, value) : s));
  return { document: withModes({ ...doc, stages }, []) };
}
