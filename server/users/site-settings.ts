import type { EntityManager } from '@mikro-orm/postgresql';
import { SITE_SETTING_ID, SiteSettingSchema, type SiteSetting } from './site-setting.entity';

/** The site settings row, created with defaults the first time it is asked for. */
export async function siteSettings(em: EntityManager): Promise<SiteSetting> {
  const found = await em.findOne(SiteSettingSchema, { id: SITE_SETTING_ID });
  if (found) return found;
  // Two first requests may race to create the row: keep whichever landed.
  await em.upsert(
    SiteSettingSchema,
    { id: SITE_SETTING_ID, openRegistration: true, updatedAt: new Date() },
    { onConflictAction: 'ignore' },
  );
  return (await em.findOne(SiteSettingSchema, { id: SITE_SETTING_ID }, { refresh: true }))!;
}
