import { Router } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import { siteSettingsSchema } from '../../shared/schema/api';
import { requireSiteAdmin } from '../common/roles';
import { parseOr422 } from '../common/validate';
import { toUserDto } from './dto';
import { siteSettings } from './site-settings';
import { UserSchema } from './user.entity';

/** /api/admin: accounts and site settings, for site admins only. */
export function adminRouter(em: EntityManager): Router {
  const router = Router();
  router.use(requireSiteAdmin);

  router.get('/users', async (_req, res) => {
    const users = await em.find(UserSchema, {}, { orderBy: { email: 'asc' } });
    res.json(users.map(toUserDto));
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
