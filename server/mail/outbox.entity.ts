import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import { baseProperties } from '../common/base.properties';

export const OUTBOX_STATES = ['pending', 'sent', 'failed'] as const;

/**
 * Every message the app sends passes through here: written before the attempt, so a
 * failure to send keeps the message for a later retry and never undoes the action that
 * caused it. A sent message keeps only its envelope (recipient, subject): its body may hold
 * a single-use link.
 */
export const OutboxMessageSchema = defineEntity({
  name: 'OutboxMessage',
  tableName: 'mail_outbox',
  properties: {
    ...baseProperties,
    recipient: p.string().length(254),
    subject: p.string().length(300),
    text: p.text().nullable(),
    html: p.text().nullable(),
    state: p
      .enum([...OUTBOX_STATES])
      .default('pending')
      .index(),
    attempts: p.integer().default(0),
    lastError: p.string().length(500).nullable(),
    nextAttemptAt: p.datetime().nullable(),
    sentAt: p.datetime().nullable(),
  },
});
export type OutboxMessage = InferEntity<typeof OutboxMessageSchema>;
