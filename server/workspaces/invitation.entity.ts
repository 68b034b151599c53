import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import { ROLES } from '../../shared/schema/api';
import { baseProperties } from '../common/base.properties';
import { UserSchema } from '../users/user.entity';
import { WorkspaceSchema } from './workspace.entity';

/** How long an invitation link works. */
export const INVITATION_DAYS = 7;

/**
 * An owner's invitation of an address into a workspace with a role. Single use: accepting
 * sets `acceptedAt`; revoking sets `revokedAt`. Only the token's hash is kept.
 */
export const InvitationSchema = defineEntity({
  name: 'Invitation',
  tableName: 'invitation',
  properties: {
    ...baseProperties,
    workspace: () => p.manyToOne(WorkspaceSchema).deleteRule('cascade').index(),
    email: p.string().length(254),
    role: p.enum([...ROLES]),
    tokenHash: p.string().length(64).unique(),
    invitedBy: () => p.manyToOne(UserSchema).deleteRule('cascade'),
    expiresAt: p.datetime(),
    acceptedAt: p.datetime().nullable(),
    revokedAt: p.datetime().nullable(),
  },
});
export type Invitation = InferEntity<typeof InvitationSchema>;
