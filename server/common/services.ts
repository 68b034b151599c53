import { MikroORM, type EntityManager } from '@mikro-orm/postgresql';
import nodemailer, { type Transporter } from 'nodemailer';
import pg from 'pg';
import type { Logger } from 'pino';
import type { MailConfig, ServerConfig } from '../config';
import { ormOptions } from '../mikro-orm.config';
import { createLogger } from './logger';
import { createStudyQueue, type StudyQueue } from '../studies/queue';
import { MailOutbox } from '../mail/outbox';
import { EventHub } from '../presence/event-hub';
import { settleAfterAnswerWork } from '../auth/after-answer';

/** What the app needs from the outside world; built once by initServices, passed to createApp. */
export interface Services {
  config: ServerConfig;
  orm: MikroORM;
  /** The global entity manager; handlers use `RequestContext`'s fork through `em()`. */
  em: EntityManager;
  /** Pool for the session store (kept apart from the ORM's so each can be sized alone). */
  sessionPool: pg.Pool;
  mailer: Transporter;
  /** Structured logger (pino); requests log through its per-request child `req.log`. */
  logger: Logger;
  /** The study job queue (pg-boss, started on first use; the server only sends). */
  studyQueue: StudyQueue;
  /** Sends mail through the outbox table (kept and retried when the transport fails). */
  mail: MailOutbox;
  /** Chain events (presence, saves, comments) between server processes. */
  events: EventHub;
  /** Ends every pool and connection so the process (or jest) can exit. */
  close(): Promise<void>;
}

/**
 * The mail transport: a relay by its URL (STARTTLS whenever the relay offers it), the local
 * catcher over plain SMTP on loopback, or a JSON transport that sends nothing.
 */
export function mailTransport(mail: MailConfig): Transporter {
  if (mail.kind === 'relay') return nodemailer.createTransport(mail.url);
  if (mail.kind === 'smtp') {
    return nodemailer.createTransport({
      host: mail.host,
      port: mail.port,
      secure: false,
      ignoreTLS: true,
    });
  }
  return nodemailer.createTransport({ jsonTransport: true });
}

/**
 * Connects the ORM, the session pool and the mail transport. With `connect: false` the
 * database is first reached by the first query (a server that must start while the
 * database is away, e.g. to answer 503 on /api/health).
 */
export async function initServices(
  config: ServerConfig,
  opts: { connect?: boolean } = {},
): Promise<Services> {
  const connect = opts.connect ?? true;
  const orm = await MikroORM.init(
    ormOptions(config.databaseUrl, {
      ...(config.dbSchema ? { schema: config.dbSchema } : {}),
      ...(connect ? {} : { connect: false, ensureDatabase: false }),
    }),
  );
  const logger = createLogger(config.log);
  const sessionPool = new pg.Pool({ connectionString: config.databaseUrl, max: 4 });
  // An idle client losing its connection must not crash the server; the pool replaces it.
  sessionPool.on('error', (err) =>
    logger.warn({ err: { message: err.message } }, 'session pool lost a connection'),
  );
  const mailer = mailTransport(config.mail);
  const studyQueue = createStudyQueue(config.databaseUrl, config.dbSchema, { maintain: false });
  const events = new EventHub(config.databaseUrl, config.dbSchema);
  return {
    config,
    orm,
    em: orm.em,
    sessionPool,
    mailer,
    logger,
    studyQueue,
    mail: new MailOutbox(mailer),
    events,
    async close() {
      await settleAfterAnswerWork();
      await events.close();
      await studyQueue.stop();
      mailer.close();
      await sessionPool.end();
      await orm.close(true);
    },
  };
}
