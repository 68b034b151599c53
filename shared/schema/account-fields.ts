/** Roles and the fields of account forms, shared by the API's schemas (re-exported by api.ts). */
import { z } from 'zod';

export const email = z.string().trim().toLowerCase().email('enter a valid e-mail address').max(254);
export const password = z
  .string()
  .min(10, 'a password needs at least 10 characters')
  .max(200, 'a password may have at most 200 characters');

export const ROLES = ['owner', 'editor', 'viewer'] as const;
export type WorkspaceRole = (typeof ROLES)[number];
export const SITE_ROLES = ['admin', 'user'] as const;
export type SiteRole = (typeof SITE_ROLES)[number];
