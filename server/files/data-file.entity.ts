import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import { DATA_FILE_KINDS } from '../../shared/schema/api';
import { baseProperties } from '../common/base.properties';
import { UserSchema } from '../users/user.entity';
import { WorkspaceSchema } from '../workspaces/workspace.entity';

/**
 * A measured Touchstone file uploaded to a workspace, kept as its text. The port count,
 * point count and frequency range are read from it at upload, for the file list.
 */
export const DataFileSchema = defineEntity({
  name: 'DataFile',
  tableName: 'data_file',
  properties: {
    ...baseProperties,
    workspace: () => p.manyToOne(WorkspaceSchema).deleteRule('cascade').index(),
    name: p.string().length(200),
    kind: p.enum([...DATA_FILE_KINDS]),
    content: p.text(),
    portCount: p.integer(),
    pointCount: p.integer(),
    fMinHz: p.double().$type<number>().fieldName('f_min_hz'),
    fMaxHz: p.double().$type<number>().fieldName('f_max_hz'),
    uploadedBy: () => p.manyToOne(UserSchema).deleteRule('restrict'),
  },
});
export type DataFile = InferEntity<typeof DataFileSchema>;
