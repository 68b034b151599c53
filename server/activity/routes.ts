import { Router } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import { z } from 'zod';
import { access, workspaceRole } from '../common/roles';
import { parseOr422 } from '../common/validate';
import { ActivitySchema } from './activity.entity';
import { toActivityDto } from './record';

const activityQuery = z.object({
  limit: z.coerce.number().int().min(1).max(200).default(50),
  /** Entries older than this time (ISO), for the next page. */
  before: z.iso.datetime({ error: 'before must be an ISO date and time' }).optional(),
});

/** GET /api/workspaces/:wid/activity: what happened lately, newest first (members). */
export function activityRouter(em: EntityManager): Router {
  const router = Router();
  router.get('/:wid/activity', workspaceRole(em, 'viewer'), async (req, res) => {
    const q = parseOr422(activityQuery, req.query, 'query');
    const entries = await em.find(
      ActivitySchema,
      {
        workspace: access(res).workspace.id,
        ...(q.before ? { createdAt: { $lt: new Date(q.before) } } : {}),
      },
      { populate: ['actor'], orderBy: { createdAt: 'desc' }, limit: q.limit },
    );
    res.json(entries.map(toActivityDto));
  });
  return router;
}
