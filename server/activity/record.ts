import type { EntityManager } from '@mikro-orm/postgresql';
import type { ActivityDto, ActivityKind } from '../../shared/schema/api';
import type { User } from '../users/user.entity';
import { ActivitySchema, type Activity } from './activity.entity';

/** Adds an entry to a workspace's activity (flushed by the caller's next flush). */
export function recordActivity(
  em: EntityManager,
  entry: {
    workspaceId: string;
    actor: User;
    kind: ActivityKind;
    summary: string;
    chainId?: string;
  },
): Activity {
  return em.create(ActivitySchema, {
    workspace: entry.workspaceId,
    actor: entry.actor,
    kind: entry.kind,
    summary: entry.summary.slice(0, 500),
    chainId: entry.chainId ?? null,
  });
}

/** The app path an entry points at. */
function linkOf(a: Activity): string | null {
  const wid = a.workspace.id;
  if (a.kind === 'chain-deleted') return `/w/${wid}/chains`;
  if (a.chainId) return `/w/${wid}/chains/${a.chainId}`;
  if (a.kind === 'member-invited' || a.kind === 'member-joined') return `/w/${wid}/members`;
  return null;
}

export function toActivityDto(a: Activity): ActivityDto {
  return {
    id: a.id,
    kind: a.kind,
    actor: a.actor.displayName,
    summary: a.summary,
    chainId: a.chainId ?? null,
    link: linkOf(a),
    createdAt: a.createdAt.toISOString(),
  };
}
