import { LockMode } from '@mikro-orm/core';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Transporter } from 'nodemailer';
import type { MailOutcomeDto } from '../../shared/schema/api';
import type { Mail } from './layout';
import { OutboxMessageSchema, type OutboxMessage } from './outbox.entity';

export const MAIL_FROM = 'Chainwright <no-reply@chainwright.localhost>';
/** Attempts before a message is left for a person to look at (admin's outbox). */
export const MAX_ATTEMPTS = 8;
/** How long a claimed message is left to the process that claimed it before another may try. */
const CLAIM_LEASE_MS = 5 * 60_000;

/** Minutes before attempt n+1: 1, 2, 4, ... capped at an hour. */
function backoffMs(attempts: number): number {
  return Math.min(60, 2 ** Math.max(0, attempts - 1)) * 60_000;
}

/**
 * Sends mail through the outbox table. The row is written first, in a transaction of its
 * own (so it survives whatever the caller does next), then the transport is tried once.
 */
export class MailOutbox {
  constructor(private readonly transport: Transporter) {}

  /** Queues and tries `mail`; the outcome tells the person who acted whether it went. */
  async send(em: EntityManager, mail: Mail): Promise<MailOutcomeDto> {
    const fork = em.fork();
    const row = fork.create(OutboxMessageSchema, {
      recipient: mail.to,
      subject: mail.subject,
      text: mail.text,
      html: mail.html,
      state: 'pending',
    });
    await fork.flush();
    return this.attempt(fork, row);
  }

  /**
   * Retries every failed message whose time has come; returns how many went. Each server
   * process runs this: the due rows are first claimed (locked with SKIP LOCKED and their
   * next attempt moved a lease ahead, in one short transaction), so two processes never
   * send the same message twice, and a process dying mid-send leaves it due again later.
   */
  async retryDue(em: EntityManager, now = new Date()): Promise<number> {
    const fork = em.fork();
    const claimed = await fork.transactional(async (tem) => {
      const rows = await tem.find(
        OutboxMessageSchema,
        { state: 'failed', attempts: { $lt: MAX_ATTEMPTS }, nextAttemptAt: { $lte: now } },
        {
          orderBy: { createdAt: 'asc' },
          limit: 50,
          lockMode: LockMode.PESSIMISTIC_PARTIAL_WRITE,
        },
      );
      for (const row of rows) row.nextAttemptAt = new Date(now.getTime() + CLAIM_LEASE_MS);
      return rows.map((row) => row.id);
    });
    const due = claimed.length
      ? await fork.find(
          OutboxMessageSchema,
          { id: { $in: claimed } },
          { orderBy: { createdAt: 'asc' } },
        )
      : [];
    let sent = 0;
    for (const row of due) if ((await this.attempt(fork, row)).sent) sent += 1;
    return sent;
  }

  /** Tries one failed message again now, whatever its schedule (the admin's retry button). */
  async retryOne(em: EntityManager, id: string): Promise<MailOutcomeDto | null> {
    const fork = em.fork();
    const row = await fork.findOne(OutboxMessageSchema, { id, state: { $ne: 'sent' } });
    return row ? this.attempt(fork, row) : null;
  }

  private async attempt(em: EntityManager, row: OutboxMessage): Promise<MailOutcomeDto> {
    row.attempts += 1;
    try {
      await this.transport.sendMail({
        from: MAIL_FROM,
        to: row.recipient,
        subject: row.subject,
        text: row.text ?? '',
        html: row.html ?? undefined,
      });
      row.state = 'sent';
      row.sentAt = new Date();
      row.nextAttemptAt = null;
      row.lastError = null;
      row.text = null;
      row.html = null;
      await em.flush();
      return { sent: true, outboxId: row.id };
    } catch (err) {
      const reason = (err as Error).message.slice(0, 480);
      row.state = 'failed';
      row.lastError = reason;
      row.nextAttemptAt =
        row.attempts < MAX_ATTEMPTS ? new Date(Date.now() + backoffMs(row.attempts)) : null;
      await em.flush();
      console.warn(`[server] mail to ${row.recipient} failed (attempt ${row.attempts}): ${reason}`);
      return {
        sent: false,
        outboxId: row.id,
        message:
          row.attempts < MAX_ATTEMPTS
            ? `the mail to ${row.recipient} could not be sent yet (${reason}); it is kept and retried automatically`
            : `the mail to ${row.recipient} could not be sent after ${row.attempts} attempts; a site admin can retry it`,
      };
    }
  }
}
