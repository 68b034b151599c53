import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import { ChainSchema } from '../chains/chain.entity';
import { UserSchema } from '../users/user.entity';

/**
 * One open event stream: who has which chain open, in any server process. Rows are
 * refreshed while the stream lives and deleted when it ends; a row not refreshed for a
 * while (a process that died) no longer counts.
 */
export const PresenceSchema = defineEntity({
  name: 'Presence',
  tableName: 'chain_presence',
  properties: {
    /** The stream's own id (one per browser tab). */
    id: p.uuid().primary(),
    chain: () => p.manyToOne(ChainSchema).deleteRule('cascade').index(),
    user: () => p.manyToOne(UserSchema).deleteRule('cascade'),
    seenAt: p.datetime(),
  },
});
export type Presence = InferEntity<typeof PresenceSchema>;
