import { Router } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import { adminUserUpdateSchema, siteSettingsSchema } from '../../shared/schema/api';
import { currentUser, requireSiteAdmin, uuidParam } from '../common/roles';
import { parseOr422 } from '../common/validate';
import { deleteAccount, setAccountActive } from './account-admin';
import { toAdminUserDto } from './dto';
import { siteSettings } from './site-settings';
import { UserSchema } from './user.entity';

/** /api/admin: accounts and site settings, for site admins only. */
export function adminRouter(em: EntityManager, schema?: string): Router {
  const router = Router();
  router.use(requireSiteAdmin);

  router.get('/users', async (_req, res) => {
    const users = await em.find(UserSchema, {}, { orderBy: { email: 'asc' } });
    res.json(users.map(toAdminUserDto));
  });

  // Deactivate or reactivate: { active: false | true }.
  router.patch('/users/:userId', async (req, res) => {
    const body = parseOr422(adminUserUpdateSchema, req.body);
    const user = await setAccountActive(
      em,
      currentUser(req),
      uuidParam(req, 'userId', 'account'),
      body.active,
      schema,
    );
    res.json(toAdminUserDto(user));
  });

  router.delete('/users/:userId', async (req, res) => {
    const report = await deleteAccount(
      em,
      currentUser(req),
      uuidParam(req, 'userId', 'account'),
      schema,
    );
    res.json(report);
  });

  router.get('/settings', async (_req, res) => {
    const settings = await siteSettings(em);
    res.json({ openRegistration: settings.openRegistration });
  });

  router.patch('/settings', async (req, res) => {
    const body = parseOr422(siteSettingsSchema, req.body);
    const settings = await siteSettings(em);
    settings.openRegistration = body.openRegistration;
    await em.flush();
    res.json({ openRegistration: settings.openRegistration });
  });

  return router;
}
