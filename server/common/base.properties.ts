import { randomUUID } from 'node:crypto';
import { p } from '@mikro-orm/core';

/**
 * Columns every entity carries: a UUID primary key made in the app (so an id is known
 * before the flush) and creation / update timestamps.
 */
export const baseProperties = {
  id: p
    .uuid()
    .primary()
    .onCreate(() => randomUUID()),
  createdAt: p.datetime().onCreate(() => new Date()),
  updatedAt: p
    .datetime()
    .onCreate(() => new Date())
    .onUpdate(() => new Date()),
};
