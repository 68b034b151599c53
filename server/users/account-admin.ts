import { LockMode } from '@mikro-orm/core';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { AccountDeletedDto } from '../../shared/schema/api';
import { ChainSchema } from '../chains/chain.entity';
import { ConflictError, NotFoundError } from '../common/errors';
import { forgetCachedSessions } from '../auth/session-cache';
import { SESSION_TABLE } from '../mikro-orm.config';
import { MembershipSchema } from '../workspaces/membership.entity';
import { WorkspaceSchema } from '../workspaces/workspace.entity';
import { UserSchema, type User } from './user.entity';

/** Display name an erased account keeps, so chains and revisions still show an author. */
export const DELETED_ACCOUNT_NAME = 'Deleted account';

/**
 * Ends every session of `userId` (rows of the session store whose passport user it is).
 * The cached reads are dropped here and again when the transaction ends (the callers): a
 * read in between still sees the row, but also the account's deactivation, which signs
 * the session out on its next request.
 */
async function endSessions(em: EntityManager, userId: string, schema?: string): Promise<void> {
  const table = schema ? `"${schema.replace(/"/g, '""')}"."${SESSION_TABLE}"` : SESSION_TABLE;
  await em.execute(`delete from ${table} where sess->'passport'->>'user' = ?`, [userId]);
  forgetCachedSessions();
}

async function lockTarget(em: EntityManager, admin: User, userId: string): Promise<User> {
  const user = await em.findOne(
    UserSchema,
    { id: userId },
    { lockMode: LockMode.PESSIMISTIC_WRITE },
  );
  if (!user || user.deletedAt) throw new NotFoundError('no such account');
  if (user.id === admin.id) {
    throw new ConflictError(
      'own-account',
      'you cannot deactivate or delete your own account; ask another site admin',
    );
  }
  return user;
}

/**
 * Deactivates (`active: false`) or reactivates an account. A deactivated account cannot
 * sign in and its sessions end at once; its memberships and chains are untouched.
 */
export async function setAccountActive(
  em: EntityManager,
  admin: User,
  userId: string,
  active: boolean,
  schema?: string,
): Promise<User> {
  const user = await em.transactional(async (tem) => {
    const user = await lockTarget(tem, admin, userId);
    user.deactivatedAt = active ? null : (user.deactivatedAt ?? new Date());
    if (!active) await endSessions(tem, user.id, schema);
    return user;
  });
  if (!active) forgetCachedSessions();
  return user;
}

/**
 * Deletes an account. Workspaces it was the only member of are deleted with their chains
 * and data files; from shared workspaces it is removed, and the chains there stay, credited
 * to "Deleted account". Refused (409) while it is the last owner of a workspace that has
 * other members: make someone else an owner first. Its address, name and password are
 * erased and its sessions end; the address is free to register again.
 */
export async function deleteAccount(
  em: EntityManager,
  admin: User,
  userId: string,
  schema?: string,
): Promise<AccountDeletedDto> {
  const report = await em.transactional(async (tem) => {
    const user = await lockTarget(tem, admin, userId);
    const mine = await tem.find(MembershipSchema, { user: user.id }, { populate: ['workspace'] });
    const report: AccountDeletedDto = { deletedWorkspaces: [], leftWorkspaces: [] };
    const orphaned: string[] = [];
    for (const membership of mine) {
      const workspace = membership.workspace;
      // Lock the workspace's memberships so a concurrent role change cannot slip between.
      const members = await tem.find(
        MembershipSchema,
        { workspace: workspace.id },
        { lockMode: LockMode.PESSIMISTIC_WRITE },
      );
      const others = members.filter((m) => m.user.id !== user.id);
      const chainCount = await tem.count(ChainSchema, { workspace: workspace.id });
      const entry = { id: workspace.id, name: workspace.name, chainCount };
      if (others.length === 0) {
        report.deletedWorkspaces.push(entry);
      } else if (membership.role === 'owner' && !others.some((m) => m.role === 'owner')) {
        orphaned.push(workspace.name);
      } else {
        report.leftWorkspaces.push(entry);
      }
    }
    if (orphaned.length > 0) {
      throw new ConflictError(
        'last-owner',
        `this account is the last owner of ${orphaned.map((n) => `"${n}"`).join(', ')}, ` +
          'which other people use; make one of them an owner first',
        { workspaces: orphaned },
      );
    }
    const gone = report.deletedWorkspaces.map((w) => w.id);
    if (gone.length > 0) await tem.nativeDelete(WorkspaceSchema, { id: { $in: gone } });
    await tem.nativeDelete(MembershipSchema, { user: user.id });
    await endSessions(tem, user.id, schema);
    const now = new Date();
    user.email = `deleted-${user.id}@deleted.invalid`;
    user.displayName = DELETED_ACCOUNT_NAME;
    // Not a hash verifyPassword recognises: nothing can ever match it.
    user.passwordHash = 'deleted';
    user.siteRole = 'user';
    user.deactivatedAt ??= now;
    user.deletedAt = now;
    return report;
  });
  forgetCachedSessions();
  return report;
}
