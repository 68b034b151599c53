import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import { baseProperties } from '../common/base.properties';
import { ChainSchema } from '../chains/chain.entity';
import { UserSchema } from '../users/user.entity';

/**
 * A read-only link to one chain for people without an account. Only the token's hash is
 * kept; revoking sets `revokedAt`, which the next request sees.
 */
export const ShareLinkSchema = defineEntity({
  name: 'ShareLink',
  tableName: 'share_link',
  properties: {
    ...baseProperties,
    chain: () => p.manyToOne(ChainSchema).deleteRule('cascade').index(),
    tokenHash: p.string().length(64).unique(),
    createdBy: () => p.manyToOne(UserSchema).deleteRule('cascade'),
    expiresAt: p.datetime().nullable(),
    revokedAt: p.datetime().nullable(),
  },
});
export type ShareLink = InferEntity<typeof ShareLinkSchema>;
