import type { StudyDto, StudySummaryDto } from '../../shared/schema/studies';
import type { Study } from './study.entity';

const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);

/** A study for lists: everything but the result. */
export function toStudySummaryDto(
  s: Omit<Study, 'document' | 'checkpoint' | 'result'>,
): StudySummaryDto {
  const by = s.createdBy;
  return {
    id: s.id,
    chainId: s.chain.id,
    chainVersion: s.chainVersion,
    kind: s.spec.kind,
    status: s.status,
    spec: s.spec,
    progress: s.progress ?? null,
    error: s.error ?? null,
    attempts: s.attempts,
    cancelRequested: s.cancelRequested,
    createdAt: s.createdAt.toISOString(),
    startedAt: iso(s.startedAt),
    finishedAt: iso(s.finishedAt),
    createdBy:
      by && 'displayName' in by && by.displayName
        ? { id: by.id, displayName: by.displayName }
        : null,
  };
}

export function toStudyDto(s: Study): StudyDto {
  return { ...toStudySummaryDto(s), result: s.result ?? null };
}
