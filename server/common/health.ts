import type { RequestHandler } from 'express';
import type { MikroORM } from '@mikro-orm/postgresql';
import { loggableError } from './db-errors';
import { RETRY_AFTER_SECONDS } from './error-handler';

/**
 * GET /api/health: 200 `{status:'ok', db:'ok'}` when the database answers, else 503 with
 * Retry-After. Anyone may call it, so the driver's error goes to the log, not the answer.
 */
export function healthHandler(orm: MikroORM): RequestHandler {
  return async (req, res) => {
    try {
      await orm.em.getConnection().execute('select 1');
      res.json({ status: 'ok', db: 'ok' });
    } catch (err) {
      req.log?.warn({ err: loggableError(err) }, 'health: database unreachable');
      res.setHeader('Retry-After', String(RETRY_AFTER_SECONDS));
      res.status(503).json({
        status: 'degraded',
        db: 'unreachable',
        error: 'db-unreachable',
        message: 'the database does not answer; the server log says why',
      });
    }
  };
}

/**
 * A probe for the error middleware: whether the database answers `select 1` within
 * `timeoutMs`. Requests failing together share one probe, and its answer is kept for
 * `keepMs`, so an outage under traffic costs one query per interval, not one per request.
 */
export function databaseProbe(
  orm: MikroORM,
  timeoutMs = 1000,
  keepMs = 500,
): () => Promise<boolean> {
  let pending: Promise<boolean> | null = null;
  let last: { up: boolean; at: number } | null = null;
  return () => {
    if (last && Date.now() - last.at < keepMs) return Promise.resolve(last.up);
    pending ??= new Promise<boolean>((resolve) => {
      const timer = setTimeout(() => resolve(false), timeoutMs);
      timer.unref();
      orm.em
        .getConnection()
        .execute('select 1')
        .then(
          () => resolve(true),
          () => resolve(false),
        )
        .finally(() => clearTimeout(timer));
    }).then((up) => {
      last = { up, at: Date.now() };
      pending = null;
      return up;
    });
    return pending;
  };
}
