import { randomUUID } from 'node:crypto';
import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import type { ChainDocument } from '../../shared/schema/chain';
import type { StudySpec } from '../../shared/schema/studies';
import { ChainSchema } from '../chains/chain.entity';
import { UserSchema } from '../users/user.entity';

/** queued → running → done | failed | cancelled (running → queued again when resumed). */
export type StudyStatus = 'queued' | 'running' | 'done' | 'failed' | 'cancelled';

/** What a running study last reported (fraction 0…1 and interim figures). */
export interface StudyProgress {
  fraction: number;
  done: number;
  total: number;
  /** Study-specific interim figures (best cost so far, yield so far, …). */
  interim?: Record<string, unknown>;
}

/**
 * One study (Monte Carlo, band, optimiser) of a chain at one saved version. It keeps the
 * document it ran on, so its result stays tied to that revision after later edits. The worker
 * that runs it writes progress, a heartbeat and checkpoints here; the web server reads them.
 */
export const StudySchema = defineEntity({
  name: 'Study',
  tableName: 'study',
  properties: {
    id: p
      .uuid()
      .primary()
      .onCreate(() => randomUUID()),
    chain: () => p.manyToOne(ChainSchema).deleteRule('cascade'),
    chainVersion: p.integer(),
    createdBy: () => p.manyToOne(UserSchema).deleteRule('cascade'),
    kind: p.string().length(20),
    status: p.string().length(12).$type<StudyStatus>().default('queued'),
    spec: p.json<StudySpec>(),
    document: p.json<ChainDocument>(),
    progress: p.json<StudyProgress>().nullable(),
    /** Work done so far, from which a resumed run goes on. */
    checkpoint: p.json<unknown>().nullable(),
    result: p.json<unknown>().nullable(),
    error: p.text().nullable(),
    attempts: p.integer().default(0),
    cancelRequested: p.boolean().default(false),
    createdAt: p.datetime().onCreate(() => new Date()),
    startedAt: p.datetime().nullable(),
    finishedAt: p.datetime().nullable(),
    heartbeatAt: p.datetime().nullable(),
  },
  indexes: [{ properties: ['chain', 'createdAt'] }, { properties: ['status', 'heartbeatAt'] }],
});
export type Study = InferEntity<typeof StudySchema>;
