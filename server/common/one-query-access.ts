/**
 * Access checks of the analysis routes in one SQL query each: the chain (or workspace) and
 * the caller's membership of its workspace together, rather than one query for the row and
 * another for the membership. An analysis is asked for many times a second while a value
 * is dragged, so the round trip saved is paid often. The answers (404, 403 and their
 * messages) are those of `chainRole` and `assertCanRead`.
 */
import type { RequestHandler } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { WorkspaceRole } from '../../shared/schema/api';
import { ChainSchema } from '../chains/chain.entity';
import type { User } from '../users/user.entity';
import { MembershipSchema } from '../workspaces/membership.entity';
import { WorkspaceSchema } from '../workspaces/workspace.entity';
import { ForbiddenError, NotFoundError } from './errors';
import { currentUser, roleAtLeast, uuidParam } from './roles';
import './request-types';

/** The quoted, schema-qualified table of `entity` as `em` reads it. */
function tableOf(em: EntityManager, entity: { meta: { className: string } }): string {
  const meta = em.getMetadata().get(entity.meta.className);
  const schema = meta.schema ?? em.config.get('schema');
  const quote = (id: string) => `"${id.replace(/"/g, '""')}"`;
  return schema && schema !== '*' ? `${quote(schema)}.${quote(meta.tableName)}` : quote(meta.tableName); // prettier-ignore
}

function assertRole(role: WorkspaceRole | null, min: WorkspaceRole, notMember: string): void {
  if (!role) throw new ForbiddenError(notMember, 'not-member');
  if (!roleAtLeast(role, min)) {
    throw new ForbiddenError(`this needs the ${min} role; yours is ${role}`, 'role-too-low');
  }
}

/**
 * `chainRole(em, min)` in one query: loads the chain named by `:id` (its workspace as a
 * reference, not loaded) and checks the caller's role in its workspace (401 anonymous, 404
 * no such chain, 403 not a member or role too low). Sets `res.locals.chain` and `role`.
 */
export function chainRoleInOneQuery(em: EntityManager, min: WorkspaceRole): RequestHandler {
  return async (req, res, next) => {
    const user = currentUser(req);
    const id = uuidParam(req, 'id', 'chain');
    const rows: Record<string, unknown>[] = await em.execute(
      `select c.*, m.role as "__member_role" from ${tableOf(em, ChainSchema)} c ` +
        `left join ${tableOf(em, MembershipSchema)} m ` +
        `on m.workspace_id = c.workspace_id and m.user_id = ? where c.id = ?`,
      [user.id, id],
    );
    if (rows.length === 0) throw new NotFoundError('no such chain');
    const { __member_role: role, ...row } = rows[0];
    assertRole(
      (role as WorkspaceRole | null) ?? null,
      min,
      'you are not a member of this workspace; ask an owner to add you',
    );
    const chain = em.map(ChainSchema, row);
    res.locals.chain = chain;
    res.locals.workspace = chain.workspace;
    res.locals.role = role as WorkspaceRole;
    next();
  };
}

/**
 * `assertCanRead` in one query: 404 when the workspace does not exist, 403 when `user` is
 * not a member of it.
 */
export async function assertCanReadInOneQuery(
  em: EntityManager,
  user: User,
  workspaceId: string,
): Promise<void> {
  const rows: { role: WorkspaceRole | null }[] = await em.execute(
    `select m.role from ${tableOf(em, WorkspaceSchema)} w ` +
      `left join ${tableOf(em, MembershipSchema)} m on m.workspace_id = w.id and m.user_id = ? ` +
      `where w.id = ?`,
    [user.id, workspaceId],
  );
  if (rows.length === 0) throw new NotFoundError('no such workspace');
  assertRole(
    rows[0].role,
    'viewer',
    'you are not a member of this workspace, so its data files cannot be used; ask an owner to add you',
  );
}
