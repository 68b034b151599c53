import type { EntityManager } from '@mikro-orm/postgresql';
import type { MemberDto, WorkspaceRole } from '../../shared/schema/api';
import { LockMode } from '@mikro-orm/core';
import { ConflictError, NotFoundError } from '../common/errors';
import { MembershipSchema, type Membership } from './membership.entity';
import { WorkspaceSchema } from './workspace.entity';
import { membershipsOf } from './membership.repository';

/** The public view of a membership. */
export function toMemberDto(m: Membership): MemberDto {
  return { userId: m.user.id, email: m.user.email, displayName: m.user.displayName, role: m.role };
}

/**
 * Changes a member's role, or removes them (`newRole` null), refusing (409) to take the
 * owner role away from the last owner: a workspace without an owner could never manage its
 * members again. The check and the write share one transaction holding a lock on the
 * workspace row, so two owners demoting each other at once cannot both succeed.
 */
export async function changeMembership(
  em: EntityManager,
  workspaceId: string,
  userId: string,
  newRole: WorkspaceRole | null,
): Promise<Membership> {
  return em.transactional(async (tem) => {
    await tem.findOneOrFail(WorkspaceSchema, workspaceId, {
      lockMode: LockMode.PESSIMISTIC_WRITE,
    });
    const membership = await tem.findOne(
      MembershipSchema,
      { workspace: workspaceId, user: userId },
      { populate: ['user'], refresh: true },
    );
    if (!membership) throw new NotFoundError('no such member in this workspace');
    if (membership.role === 'owner' && newRole !== 'owner') {
      const owners = await membershipsOf(tem).countOwners(workspaceId);
      if (owners <= 1) {
        throw new ConflictError(
          'last-owner',
          'a workspace needs at least one owner: make someone else owner before removing or demoting this one',
        );
      }
    }
    if (newRole) membership.role = newRole;
    else tem.remove(membership);
    return membership;
  });
}
