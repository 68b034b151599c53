/**
 * Edits of a chain with modes that keep each mode's meaning: stages inserted after a stage
 * join the modes that use that stage (a mode's path takes them right after it; a mode that
 * leaves that stage out leaves them out too).
 */
import type { Mode } from '../../schema/chain';

/**
 * The document with `stages` inserted after stage `afterStageId` (the input is untouched).
 * @throws Error when there is no such stage (a programming error of the caller)
 */
export function insertStagesAfter<
  S extends { id: string },
  M extends Pick<Mode, 'path' | 'bypass'>,
  D extends { stages: S[]; modes?: M[] },
>(doc: D, afterStageId: string, stages: S[]): D {
  const at = doc.stages.findIndex((s) => s.id === afterStageId);
  if (at < 0) throw new Error(`there is no stage "${afterStageId}" in this chain`);
  const ids = stages.map((s) => s.id);
  const modes = doc.modes?.map((m): M => {
    if (m.path) {
      const k = m.path.indexOf(afterStageId);
      return k < 0 ? m : { ...m, path: [...m.path.slice(0, k + 1), ...ids, ...m.path.slice(k + 1)] }; // prettier-ignore
    }
    return m.bypass?.includes(afterStageId) ? { ...m, bypass: [...m.bypass, ...ids] } : m;
  });
  return {
    ...doc,
    stages: [...doc.stages.slice(0, at + 1), ...stages, ...doc.stages.slice(at + 1)],
    ...(modes ? { modes } : {}),
  };
}
