import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import { baseProperties } from '../common/base.properties';
import { ChainSchema } from '../chains/chain.entity';
import { UserSchema } from '../users/user.entity';

/** A note on a chain, or on one of its stages (`stageId`, the stage's id in the document). */
export const CommentSchema = defineEntity({
  name: 'Comment',
  tableName: 'chain_comment',
  properties: {
    ...baseProperties,
    chain: () => p.manyToOne(ChainSchema).deleteRule('cascade').index(),
    stageId: p.string().length(64).nullable(),
    author: () => p.manyToOne(UserSchema).deleteRule('cascade'),
    body: p.text(),
    editedAt: p.datetime().nullable(),
  },
});
export type Comment = InferEntity<typeof CommentSchema>;
