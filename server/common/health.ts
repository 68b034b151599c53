import type { RequestHandler } from 'express';
import type { MikroORM } from '@mikro-orm/postgresql';

/** GET /api/health: 200 `{status:'ok', db:'ok'}` when the database answers, else 503. */
export function healthHandler(orm: MikroORM): RequestHandler {
  return async (_req, res) => {
    try {
      await orm.em.getConnection().execute('select 1');
      res.json({ status: 'ok', db: 'ok' });
    } catch (err) {
      res.status(503).json({
        status: 'degraded',
        db: 'unreachable',
        error: 'db-unreachable',
        message: String((err as Error).message),
      });
    }
  };
}
