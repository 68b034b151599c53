import { Router } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { MeDto } from '../../shared/schema/api';
import { currentUser } from '../common/roles';
import { membershipsOf } from '../workspaces/membership.repository';
import { toUserDto } from './dto';

/**
 * /api/me: who is signed in, and their workspaces. `mailCatcher` tells a site admin whether
 * the local development mail catcher is in use (the development mailbox exists only then).
 */
export function meRouter(em: EntityManager, mailCatcher = false): Router {
  const router = Router();
  router.get('/', async (req, res) => {
    const user = currentUser(req);
    const memberships = await membershipsOf(em).listForUser(user.id);
    const body: MeDto = {
      user: toUserDto(user),
      memberships: memberships.map((m) => ({
        workspaceId: m.workspace.id,
        workspaceName: m.workspace.name,
        role: m.role,
      })),
      ...(user.siteRole === 'admin' ? { mailCatcher } : {}),
    };
    res.json(body);
  });
  return router;
}
