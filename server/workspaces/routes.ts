import { Router } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import { changeRoleSchema, workspaceNameSchema, type WorkspaceDto } from '../../shared/schema/api';
import { ForbiddenError } from '../common/errors';
import { access, currentUser, requireUser, uuidParam, workspaceRole } from '../common/roles';
import { parseOr422 } from '../common/validate';
import { changeMembership, toMemberDto } from './members';
import { MembershipSchema } from './membership.entity';
import { membershipsOf } from './membership.repository';
import { WorkspaceSchema } from './workspace.entity';

/**
 * /api/workspaces: the caller's workspaces, renaming, and members. New members come by
 * invitation (invitation-routes.ts); chains are in chains/routes.ts.
 */
export function workspacesRouter(em: EntityManager): Router {
  const router = Router();
  router.use(requireUser);

  router.get('/', async (req, res) => {
    const memberships = await membershipsOf(em).listForUser(currentUser(req).id);
    const body: WorkspaceDto[] = memberships.map((m) => ({
      id: m.workspace.id,
      name: m.workspace.name,
      role: m.role,
    }));
    res.json(body);
  });

  router.post('/', async (req, res) => {
    const { name } = parseOr422(workspaceNameSchema, req.body);
    const workspace = em.create(WorkspaceSchema, { name });
    em.create(MembershipSchema, { user: currentUser(req), workspace, role: 'owner' });
    await em.flush();
    const body: WorkspaceDto = { id: workspace.id, name: workspace.name, role: 'owner' };
    res.status(201).json(body);
  });

  router.patch('/:wid', workspaceRole(em, 'owner'), async (req, res) => {
    const { name } = parseOr422(workspaceNameSchema, req.body);
    const { workspace, role } = access(res);
    workspace.name = name;
    await em.flush();
    const body: WorkspaceDto = { id: workspace.id, name: workspace.name, role };
    res.json(body);
  });

  router.get('/:wid/members', workspaceRole(em, 'viewer'), async (_req, res) => {
    const members = await membershipsOf(em).listMembers(access(res).workspace.id);
    res.json(members.map(toMemberDto));
  });

  router.patch('/:wid/members/:uid', workspaceRole(em, 'owner'), async (req, res) => {
    const { role } = parseOr422(changeRoleSchema, req.body);
    const wid = access(res).workspace.id;
    const uid = uuidParam(req, 'uid', 'member');
    const membership = await changeMembership(em, wid, uid, role);
    res.json(toMemberDto(membership));
  });

  // Owners remove anyone; any member may remove themselves (leave the workspace).
  router.delete('/:wid/members/:uid', workspaceRole(em, 'viewer'), async (req, res) => {
    const uid = uuidParam(req, 'uid', 'member');
    const { workspace, role } = access(res);
    if (role !== 'owner' && uid !== currentUser(req).id) {
      throw new ForbiddenError(
        'this needs the owner role; you may only remove yourself',
        'role-too-low',
      );
    }
    await changeMembership(em, workspace.id, uid, null);
    res.status(204).end();
  });

  return router;
}
