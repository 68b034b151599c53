import { EntityRepository } from '@mikro-orm/postgresql';
import type { EntityManager } from '@mikro-orm/postgresql';
import { MembershipSchema, type Membership } from './membership.entity';

/** Queries about who belongs to which workspace. */
export class MembershipRepository extends EntityRepository<Membership> {
  /** The user's membership in the workspace, or null when they are not a member. */
  findFor(userId: string, workspaceId: string) {
    return this.findOne({ user: userId, workspace: workspaceId });
  }

  /** A user's memberships with their workspaces, by workspace name. */
  listForUser(userId: string) {
    return this.find(
      { user: userId },
      { populate: ['workspace'], orderBy: { workspace: { name: 'asc' } } },
    );
  }

  /** A workspace's members with their accounts, by display name. */
  listMembers(workspaceId: string) {
    return this.find(
      { workspace: workspaceId },
      { populate: ['user'], orderBy: { user: { displayName: 'asc' } } },
    );
  }

  /** How many owners the workspace has. */
  countOwners(workspaceId: string) {
    return this.count({ workspace: workspaceId, role: 'owner' });
  }
}

/** The membership repository of `em` (its request context when inside one). */
export function membershipsOf(em: EntityManager): MembershipRepository {
  return em.getRepository<Membership, MembershipRepository>(MembershipSchema);
}
