import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import { baseProperties } from '../common/base.properties';

/** A team's shared space: its members and chains. */
export const WorkspaceSchema = defineEntity({
  name: 'Workspace',
  tableName: 'workspace',
  properties: {
    ...baseProperties,
    name: p.string().length(120),
  },
});
export type Workspace = InferEntity<typeof WorkspaceSchema>;
