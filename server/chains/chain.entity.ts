import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import type { ChainDocument } from '../../shared/schema/chain';
import { baseProperties } from '../common/base.properties';
import { UserSchema } from '../users/user.entity';
import { WorkspaceSchema } from '../workspaces/workspace.entity';
import { ChainRepository } from './chain.repository';

/**
 * A chain in a workspace. `document` holds the whole chain document (JSONB); name,
 * description, f0Hz and stageCount are copies of it kept as columns for listing, searching
 * and sorting. `version` counts saves and guards against overwriting a newer save.
 */
export const ChainSchema = defineEntity({
  name: 'Chain',
  tableName: 'chain',
  properties: {
    ...baseProperties,
    workspace: () => p.manyToOne(WorkspaceSchema).deleteRule('cascade').index(),
    name: p.string().length(200),
    description: p.text().default(''),
    f0Hz: p.double().$type<number>().fieldName('f0_hz'),
    stageCount: p.integer(),
    /**
     * Flags of severity warning or error found by the engine at the last save; null when the
     * chain could not be analysed then (shown as unknown, never as no flags).
     */
    flagCount: p.integer().nullable(),
    document: p.json<ChainDocument>(),
    version: p.integer().default(1),
    /** Set on a variant: the chain it was copied from, kept for comparison. */
    parent: () => p.manyToOne(ChainSchema).nullable().deleteRule('set null'),
    createdBy: () => p.manyToOne(UserSchema).deleteRule('restrict'),
    updatedBy: () => p.manyToOne(UserSchema).deleteRule('restrict'),
  },
  repository: () => ChainRepository,
});
export type Chain = InferEntity<typeof ChainSchema>;
