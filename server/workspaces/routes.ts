import { Router } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Transporter } from 'nodemailer';
import {
  addMemberSchema,
  changeRoleSchema,
  workspaceNameSchema,
  type WorkspaceDto,
} from '../../shared/schema/api';
import { ConflictError, ForbiddenError, NotFoundError, ValidationError } from '../common/errors';
import { access, currentUser, requireUser, uuidParam, workspaceRole } from '../common/roles';
import { parseOr422 } from '../common/validate';
import { sendMemberAddedMail } from '../mail/notices';
import { UserSchema } from '../users/user.entity';
import { assertNotLastOwner, toMemberDto } from './members';
import { MembershipSchema } from './membership.entity';
import { membershipsOf } from './membership.repository';
import { WorkspaceSchema } from './workspace.entity';

/** /api/workspaces: the caller's workspaces, renaming, and members. Chains are in chains/routes.ts. */
export function workspacesRouter(em: EntityManager, mailer: Transporter): Router {
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

  router.post('/:wid/members', workspaceRole(em, 'owner'), async (req, res) => {
    const body = parseOr422(addMemberSchema, req.body);
    const { workspace } = access(res);
    const user = await em.findOne(UserSchema, { email: body.email });
    if (!user) {
      throw new ValidationError('no account has this e-mail address; ask them to register first', [
        { path: 'email', message: 'no account has this e-mail address' },
      ]);
    }
    if (await membershipsOf(em).findFor(user.id, workspace.id)) {
      throw new ConflictError(
        'already-member',
        `${user.email} is already a member; change their role instead`,
      );
    }
    const membership = em.create(MembershipSchema, { user, workspace, role: body.role });
    await em.flush();
    await sendMemberAddedMail(mailer, {
      to: user,
      by: currentUser(req),
      workspace,
      role: body.role,
    });
    res.status(201).json(toMemberDto(membership));
  });

  const findMember = async (wid: string, uid: string) => {
    const membership = await em.findOne(
      MembershipSchema,
      { workspace: wid, user: uid },
      { populate: ['user'] },
    );
    if (!membership) throw new NotFoundError('no such member in this workspace');
    return membership;
  };

  router.patch('/:wid/members/:uid', workspaceRole(em, 'owner'), async (req, res) => {
    const { role } = parseOr422(changeRoleSchema, req.body);
    const membership = await findMember(access(res).workspace.id, uuidParam(req, 'uid', 'member'));
    await assertNotLastOwner(em, membership, role);
    membership.role = role;
    await em.flush();
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
    const membership = await findMember(workspace.id, uid);
    await assertNotLastOwner(em, membership, null);
    await em.remove(membership).flush();
    res.status(204).end();
  });

  return router;
}
