import { Router } from 'express';
import type { CaughtMailDto, OutboxMessageDto } from '../../shared/schema/api';
import { HttpError, NotFoundError } from '../common/errors';
import { requireSiteAdmin } from '../common/roles';
import type { Services } from '../common/services';
import { usesMailCatcher } from '../config';
import { listCaught, readCaught } from './mailbox';
import { OutboxMessageSchema, type OutboxMessage } from './outbox.entity';

function toOutboxDto(m: OutboxMessage): OutboxMessageDto {
  return {
    id: m.id,
    recipient: m.recipient,
    subject: m.subject,
    state: m.state,
    attempts: m.attempts,
    lastError: m.lastError ?? null,
    nextAttemptAt: m.nextAttemptAt?.toISOString() ?? null,
    createdAt: m.createdAt.toISOString(),
  };
}

/**
 * /api/admin/mailbox (the local mail catcher's messages, only while it is in use) and
 * /api/admin/outbox (mail not sent yet, with a retry), for site admins.
 */
export function mailAdminRouter(services: Services): Router {
  const router = Router();
  router.use(requireSiteAdmin);
  const { em, config } = services;

  const mailDir = () => {
    if (!usesMailCatcher(config) || config.mail.kind !== 'smtp' || !config.mail.dir) {
      throw new HttpError(
        404,
        'no-mail-catcher',
        'this server sends real mail (no local mail catcher), so there is no development mailbox',
      );
    }
    return config.mail.dir;
  };

  router.get('/mailbox', async (_req, res) => {
    res.json(await listCaught(mailDir()));
  });

  router.get('/mailbox/:mailId', async (req, res) => {
    const id = String(req.params.mailId);
    const mail = await readCaught(mailDir(), id);
    if (!mail) throw new NotFoundError('the mail catcher has no such message');
    const body: CaughtMailDto = { id, ...mail };
    res.json(body);
  });

  router.get('/outbox', async (_req, res) => {
    const rows = await em.find(
      OutboxMessageSchema,
      { state: { $ne: 'sent' } },
      { orderBy: { createdAt: 'desc' }, limit: 200 },
    );
    res.json(rows.map(toOutboxDto));
  });

  router.post('/outbox/:messageId/retry', async (req, res) => {
    const outcome = await services.mail.retryOne(em, String(req.params.messageId));
    if (!outcome) throw new NotFoundError('no unsent message with this id');
    res.json(outcome);
  });

  return router;
}
