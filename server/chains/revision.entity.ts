import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import type { ChainDocument } from '../../shared/schema/chain';
import { UserSchema } from '../users/user.entity';
import { ChainSchema } from './chain.entity';
import { randomUUID } from 'node:crypto';

/** A snapshot of a chain's document at one save; revisions are never changed. */
export const ChainRevisionSchema = defineEntity({
  name: 'ChainRevision',
  tableName: 'chain_revision',
  properties: {
    id: p
      .uuid()
      .primary()
      .onCreate(() => randomUUID()),
    chain: () => p.manyToOne(ChainSchema).deleteRule('cascade'),
    /** The chain version this revision saved (1 at creation). */
    version: p.integer(),
    document: p.json<ChainDocument>(),
    author: () => p.manyToOne(UserSchema).deleteRule('restrict'),
    message: p.string().length(500).default(''),
    createdAt: p.datetime().onCreate(() => new Date()),
  },
  uniques: [{ properties: ['chain', 'version'] }],
});
export type ChainRevision = InferEntity<typeof ChainRevisionSchema>;
