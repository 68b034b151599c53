import type { ChainDto, WorkspaceRole } from '../../../../../shared/schema/api';
import { sampleDocument } from './catalogue-fixture';

/** A chain as GET /api/chains/:id answers it, around the sample document. */
export function chainDto(role: WorkspaceRole = 'editor', version = 3): ChainDto {
  const document = sampleDocument();
  return {
    id: 'c1',
    workspaceId: 'w1',
    name: document.name,
    description: '',
    f0Hz: document.settings.f0Hz,
    stageCount: document.stages.length,
    flagCount: 0,
    version,
    parentId: null,
    createdBy: 'Ada',
    updatedBy: 'Ada',
    updatedAt: '2026-01-01T00:00:00Z',
    createdAt: '2026-01-01T00:00:00Z',
    document,
    role,
  };
}
