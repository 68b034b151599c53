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
