import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import { ACTIVITY_KINDS } from '../../shared/schema/api';
import { UserSchema } from '../users/user.entity';
import { WorkspaceSchema } from '../workspaces/workspace.entity';
import { randomUUID } from 'node:crypto';

/**
 * One thing that happened in a workspace. The chain id is kept as a plain column (no
 * foreign key) so the entry outlives a deleted chain; the summary names it in words.
 */
export const ActivitySchema = defineEntity({
  name: 'Activity',
  tableName: 'activity',
  properties: {
    id: p
      .uuid()
      .primary()
      .onCreate(() => randomUUID()),
    workspace: () => p.manyToOne(WorkspaceSchema).deleteRule('cascade'),
    actor: () => p.manyToOne(UserSchema).deleteRule('cascade'),
    kind: p.enum([...ACTIVITY_KINDS]),
    summary: p.string().length(500),
    chainId: p.uuid().nullable(),
    createdAt: p.datetime().onCreate(() => new Date()),
  },
  indexes: [{ properties: ['workspace', 'createdAt'] }],
});
export type Activity = InferEntity<typeof ActivitySchema>;
