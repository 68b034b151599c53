import { defineEntity, p, type InferEntity } from '@mikro-orm/core';

/**
 * One rate-limit counter (e.g. failed sign-ins from one address), kept in PostgreSQL so the
 * limit holds across restarts and across server processes. See pg-rate-limit-store.ts.
 */
export const RateLimitHitSchema = defineEntity({
  name: 'RateLimitHit',
  tableName: 'rate_limit_hit',
  properties: {
    /** The limiter's prefix and the client's key, e.g. `signin:203.0.113.7`. */
    key: p.string().length(255).primary(),
    hits: p.integer(),
    /** When the window ends and the count starts again from zero. */
    resetAt: p.datetime().index(),
  },
});
export type RateLimitHit = InferEntity<typeof RateLimitHitSchema>;
