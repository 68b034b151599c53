import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import { baseProperties } from '../common/base.properties';
import { UserSchema } from '../users/user.entity';
import { WorkspaceSchema } from '../workspaces/workspace.entity';

/**
 * A part in a workspace's parts bin: an inductor or capacitor the team stocks, with its
 * value, the Q it has at a stated frequency and its tolerance (from the team's CSV).
 */
export const PartSchema = defineEntity({
  name: 'Part',
  tableName: 'part',
  properties: {
    ...baseProperties,
    workspace: () => p.manyToOne(WorkspaceSchema).deleteRule('cascade').index(),
    partNumber: p.string().length(100),
    kind: p.enum(['inductor', 'capacitor'] as const),
    /** Henry or farad. */
    value: p.double().$type<number>(),
    q: p.double().$type<number>().nullable(),
    qFreqHz: p.double().$type<number>().nullable().fieldName('q_freq_hz'),
    tolerancePct: p.double().$type<number>().nullable(),
    notes: p.string().length(500),
    /** Line of the uploaded CSV the part came from (kept for the team's reference). */
    sourceLine: p.integer(),
    uploadedBy: () => p.manyToOne(UserSchema).deleteRule('restrict'),
  },
});
export type Part = InferEntity<typeof PartSchema>;
