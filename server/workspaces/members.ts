import type { EntityManager } from '@mikro-orm/postgresql';
import type { MemberDto, WorkspaceRole } from '../../shared/schema/api';
import { ConflictError } from '../common/errors';
import type { Membership } from './membership.entity';
import { membershipsOf } from './membership.repository';

/** The public view of a membership. */
export function toMemberDto(m: Membership): MemberDto {
  return { userId: m.user.id, email: m.user.email, displayName: m.user.displayName, role: m.role };
}

/**
 * Refuses (409) to take the owner role away from the last owner of a workspace: a
 * workspace without an owner could never manage its members again.
 */
export async function assertNotLastOwner(
  em: EntityManager,
  membership: Membership,
  newRole: WorkspaceRole | null,
) {
  if (membership.role !== 'owner' || newRole === 'owner') return;
  const owners = await membershipsOf(em).countOwners(membership.workspace.id);
  if (owners <= 1) {
    throw new ConflictError(
      'last-owner',
      'a workspace needs at least one owner: make someone else owner before removing or demoting this one',
    );
  }
}
