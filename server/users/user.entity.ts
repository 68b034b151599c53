import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import { SITE_ROLES } from '../../shared/schema/api';
import { baseProperties } from '../common/base.properties';

/** A person who can sign in. `siteRole: 'admin'` manages accounts and site settings. */
export const UserSchema = defineEntity({
  name: 'User',
  tableName: 'app_user',
  properties: {
    ...baseProperties,
    /** Stored trimmed and lower-cased (the API schemas normalise it). */
    email: p.string().length(254).unique(),
    displayName: p.string().length(80),
    /** `scrypt$N$r$p$salt$key`, see users/password.ts. Never serialised. */
    passwordHash: p.string().length(255).hidden(),
    siteRole: p.enum([...SITE_ROLES]).default('user'),
    /** Set by an admin: the account cannot sign in and its sessions end. Null when active. */
    deactivatedAt: p.datetime().nullable(),
    /**
     * Set when an admin deleted the account: its personal data (address, name, password)
     * is erased and it can never sign in again; the row stays so the chains and revisions
     * it wrote keep an author ("Deleted account").
     */
    deletedAt: p.datetime().nullable(),
  },
});
export type User = InferEntity<typeof UserSchema>;
