import { defineEntity, p, type InferEntity } from '@mikro-orm/core';

/** The single row of site-wide settings (id is always 1). */
export const SiteSettingSchema = defineEntity({
  name: 'SiteSetting',
  tableName: 'site_setting',
  properties: {
    id: p.integer().primary().autoincrement(false),
    /** Whether anyone may register; when false only existing accounts sign in. */
    openRegistration: p.boolean().default(true),
    updatedAt: p
      .datetime()
      .onCreate(() => new Date())
      .onUpdate(() => new Date()),
  },
});
export type SiteSetting = InferEntity<typeof SiteSettingSchema>;

export const SITE_SETTING_ID = 1;
