import { randomUUID } from 'node:crypto';
import { Router, type Response } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { PresentUserDto } from '../../shared/schema/api';
import { chainRole, currentUser, loadedChain } from '../common/roles';
import type { Services } from '../common/services';
import { publishChainEvent, type ChainEvent } from './event-hub';
import { PresenceSchema } from './presence.entity';

/** How often a stream refreshes its presence row and sends a keep-alive. */
export const HEARTBEAT_MS = 15_000;
/** A presence row older than this belongs to a stream (or a process) that is gone. */
const STALE_MS = 3 * HEARTBEAT_MS;

/** Everyone with the chain open now, once each, by name. */
export async function presentUsers(em: EntityManager, chainId: string): Promise<PresentUserDto[]> {
  const rows = await em.find(
    PresenceSchema,
    { chain: chainId, seenAt: { $gt: new Date(Date.now() - STALE_MS) } },
    { populate: ['user'], orderBy: { seenAt: 'asc' } },
  );
  const byId = new Map<string, PresentUserDto>();
  for (const r of rows) byId.set(r.user.id, { userId: r.user.id, displayName: r.user.displayName });
  return [...byId.values()].sort((a, b) => a.displayName.localeCompare(b.displayName));
}

function writeEvent(res: Response, name: string, data: unknown): void {
  res.write(`event: ${name}\ndata: ${JSON.stringify(data)}\n\n`);
  // A compression middleware buffers unless told to flush.
  (res as Response & { flush?: () => void }).flush?.();
}

/**
 * GET /api/chains/:id/events: a server-sent event stream for a member with the chain open.
 * Events: "presence" (everyone here), "saved" (a new version), "comments" (they changed).
 * They come through PostgreSQL LISTEN/NOTIFY, so streams on other server processes hear them.
 */
export function presenceRouter(services: Services): Router {
  const router = Router();
  const { em, events } = services;

  router.get('/:id/events', chainRole(em, 'viewer'), async (req, res) => {
    const chainId = loadedChain(res).id;
    const userId = currentUser(req).id;
    const streamId = randomUUID();
    const db = em.fork();

    res.status(200).set({
      'Content-Type': 'text/event-stream; charset=utf-8',
      'Cache-Control': 'no-store',
      Connection: 'keep-alive',
      'X-Accel-Buffering': 'no',
    });
    res.flushHeaders();
    res.write('retry: 3000\n\n');

    let open = true;
    const onEvent = (event: ChainEvent) => {
      if (!open) return;
      if (event.type === 'presence') {
        presentUsers(db.fork(), chainId).then(
          (users) => open && writeEvent(res, 'presence', { chainId, users }),
          (err: Error) => console.error('[server] presence read failed:', err.message),
        );
      } else {
        const { type, ...data } = event;
        writeEvent(res, type, data);
      }
    };
    const unsubscribe = await events.subscribe(chainId, onEvent);

    await db.insert(PresenceSchema, {
      id: streamId,
      chain: chainId,
      user: userId,
      seenAt: new Date(),
    });
    await publishChainEvent(db, { type: 'presence', chainId });

    const heartbeat = setInterval(() => {
      if (!open) return;
      res.write(': still here\n\n');
      db.fork()
        .nativeUpdate(PresenceSchema, { id: streamId }, { seenAt: new Date() })
        .catch((err: Error) => console.error('[server] presence refresh failed:', err.message));
    }, HEARTBEAT_MS);
    heartbeat.unref();

    req.on('close', () => {
      open = false;
      clearInterval(heartbeat);
      unsubscribe();
      const leave = db.fork();
      leave
        .nativeDelete(PresenceSchema, { id: streamId })
        .then(() => publishChainEvent(leave, { type: 'presence', chainId }))
        .catch((err: Error) => {
          if (!events.isClosed) console.error('[server] presence end failed:', err.message);
        });
    });
  });

  return router;
}
