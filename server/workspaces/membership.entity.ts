import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import { ROLES } from '../../shared/schema/api';
import { baseProperties } from '../common/base.properties';
import { UserSchema } from '../users/user.entity';
import { WorkspaceSchema } from './workspace.entity';
import { MembershipRepository } from './membership.repository';

/** A user's role in one workspace; a user has at most one membership per workspace. */
export const MembershipSchema = defineEntity({
  name: 'Membership',
  tableName: 'membership',
  properties: {
    ...baseProperties,
    user: () => p.manyToOne(UserSchema).deleteRule('cascade'),
    workspace: () => p.manyToOne(WorkspaceSchema).deleteRule('cascade'),
    role: p.enum([...ROLES]),
  },
  uniques: [{ properties: ['user', 'workspace'] }],
  repository: () => MembershipRepository,
});
export type Membership = InferEntity<typeof MembershipSchema>;
