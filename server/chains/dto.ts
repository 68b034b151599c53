import type {
  ChainDto,
  ChainSummaryDto,
  RevisionDto,
  RevisionSummaryDto,
  WorkspaceRole,
} from '../../shared/schema/api';
import type { Chain } from './chain.entity';
import type { ChainRevision } from './revision.entity';

// createdBy / updatedBy / author carry display names: what the chain list and history show.

/** A chain for the list (populate createdBy and updatedBy first). */
export function toChainSummaryDto(c: Chain): ChainSummaryDto {
  return {
    id: c.id,
    workspaceId: c.workspace.id,
    name: c.name,
    description: c.description,
    f0Hz: Number(c.f0Hz),
    stageCount: c.stageCount,
    flagCount: c.flagCount ?? null,
    version: c.version,
    parentId: c.parent?.id ?? null,
    createdBy: c.createdBy.displayName,
    updatedBy: c.updatedBy.displayName,
    updatedAt: c.updatedAt.toISOString(),
  };
}

export function toChainDto(c: Chain, role: WorkspaceRole): ChainDto {
  return {
    ...toChainSummaryDto(c),
    document: c.document,
    role,
    createdAt: c.createdAt.toISOString(),
  };
}

export function toRevisionSummaryDto(
  r: Pick<ChainRevision, 'id' | 'version' | 'author' | 'message' | 'createdAt'>,
): RevisionSummaryDto {
  return {
    id: r.id,
    version: r.version,
    author: r.author.displayName,
    message: r.message,
    createdAt: r.createdAt.toISOString(),
  };
}

export function toRevisionDto(r: ChainRevision): RevisionDto {
  return { ...toRevisionSummaryDto(r), document: r.document };
}
