import type { Request, RequestHandler, Response } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { WorkspaceRole } from '../../shared/schema/api';
import { ChainSchema, type Chain } from '../chains/chain.entity';
import type { User } from '../users/user.entity';
import { membershipsOf } from '../workspaces/membership.repository';
import { WorkspaceSchema, type Workspace } from '../workspaces/workspace.entity';
import { ForbiddenError, NotFoundError, UnauthorizedError } from './errors';
import './request-types';

const RANK: Record<WorkspaceRole, number> = { viewer: 1, editor: 2, owner: 3 };
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Whether `role` is at least `min` (owner > editor > viewer). */
export function roleAtLeast(role: WorkspaceRole, min: WorkspaceRole): boolean {
  return RANK[role] >= RANK[min];
}

/** The signed-in user, or a 401. */
export function currentUser(req: Request): User {
  if (!req.user) throw new UnauthorizedError();
  return req.user;
}

/** 401 unless signed in. */
export const requireUser: RequestHandler = (req, _res, next) => {
  currentUser(req);
  next();
};

/** 401 unless signed in, 403 unless a site admin. */
export const requireSiteAdmin: RequestHandler = (req, _res, next) => {
  if (currentUser(req).siteRole !== 'admin') {
    throw new ForbiddenError('only a site admin may do this', 'admin-only');
  }
  next();
};

/** Reads a UUID route parameter; anything else cannot name a row, so it is a 404. */
export function uuidParam(req: Request, name: string, what: string): string {
  const value = req.params[name];
  if (typeof value !== 'string' || !UUID.test(value)) throw new NotFoundError(`no such ${what}`);
  return value;
}

async function checkMembership(
  em: EntityManager,
  user: User,
  workspace: Workspace,
  min: WorkspaceRole,
  res: Response,
): Promise<void> {
  const membership = await membershipsOf(em).findFor(user.id, workspace.id);
  if (!membership) {
    throw new ForbiddenError(
      'you are not a member of this workspace; ask an owner to add you',
      'not-member',
    );
  }
  if (!roleAtLeast(membership.role, min)) {
    throw new ForbiddenError(
      `this needs the ${min} role; yours is ${membership.role}`,
      'role-too-low',
    );
  }
  res.locals.workspace = workspace;
  res.locals.role = membership.role;
}

/**
 * Loads the workspace named by `:wid` and checks the caller's role in it
 * (401 anonymous, 404 no such workspace, 403 not a member or role too low).
 */
export function workspaceRole(em: EntityManager, min: WorkspaceRole): RequestHandler {
  return async (req, res, next) => {
    const user = currentUser(req);
    const workspace = await em.findOne(WorkspaceSchema, { id: uuidParam(req, 'wid', 'workspace') });
    if (!workspace) throw new NotFoundError('no such workspace');
    await checkMembership(em, user, workspace, min, res);
    next();
  };
}

/** Loads the chain named by `:id` and checks the caller's role in its workspace. */
export function chainRole(em: EntityManager, min: WorkspaceRole): RequestHandler {
  return async (req, res, next) => {
    const user = currentUser(req);
    const chain = await em.findOne(
      ChainSchema,
      { id: uuidParam(req, 'id', 'chain') },
      { populate: ['workspace'] },
    );
    if (!chain) throw new NotFoundError('no such chain');
    await checkMembership(em, user, chain.workspace, min, res);
    res.locals.chain = chain;
    next();
  };
}

/** The values the role middleware set (throws if a route forgot the middleware). */
export function access(res: Response): { workspace: Workspace; role: WorkspaceRole } {
  const { workspace, role } = res.locals;
  if (!workspace || !role) throw new Error('roles: route is missing its role middleware');
  return { workspace, role };
}

/** The chain the chainRole middleware loaded. */
export function loadedChain(res: Response): Chain {
  const chain = res.locals.chain;
  if (!chain) throw new Error('roles: route is missing chainRole middleware');
  return chain;
}
