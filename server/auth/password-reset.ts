import { Router, type RequestHandler } from 'express';
import { LockMode } from '@mikro-orm/core';
import { passwordResetRequestSchema, passwordResetSchema } from '../../shared/schema/api';
import { NotFoundError } from '../common/errors';
import type { Services } from '../common/services';
import { parseOr422 } from '../common/validate';
import { publicBaseUrl } from '../config';
import { messages } from '../mail/messages';
import { hashPassword } from '../users/password';
import { UserSchema } from '../users/user.entity';
import { PasswordResetSchema, RESET_MINUTES } from './account-token.entity';
import { endSessionsOf } from './other-sessions';
import { afterAnswer } from './after-answer';
import { assertStrongPassword } from './strength';
import { hashToken, looksLikeToken, newToken } from './tokens';

/** /api/auth/password-reset: ask for a link by mail; set a new password with it. */
export function passwordResetRoutes(services: Services, limiter: RequestHandler): Router {
  const router = Router();
  const { em, config } = services;

  // Always 202 with the same words, answered before any lookup: neither the answer nor its
  // timing says whether the address has an account.
  router.post('/', limiter, async (req, res) => {
    const { email } = parseOr422(passwordResetRequestSchema, req.body);
    res.status(202).json({
      message: `if an account has the address ${email}, a link to choose a new password is on its way; it works for ${RESET_MINUTES} minutes`,
    });
    afterAnswer(res, 'password-reset mail', async () => {
      const fork = em.fork();
      const user = await fork.findOne(UserSchema, { email });
      if (!user) return;
      const { token, hash } = newToken();
      fork.create(PasswordResetSchema, {
        user,
        tokenHash: hash,
        expiresAt: new Date(Date.now() + RESET_MINUTES * 60_000),
      });
      await fork.flush();
      await services.mail.send(
        fork,
        messages.passwordReset(email, { url: `${publicBaseUrl(config)}/reset-password/${token}` }),
      );
    });
  });

  router.post('/:token', limiter, async (req, res) => {
    const token = req.params.token;
    const body = parseOr422(passwordResetSchema, req.body);
    if (!looksLikeToken(token)) throw new NotFoundError('this password link is not valid');
    const userId = await em.transactional(async (tem) => {
      const reset = await tem.findOne(
        PasswordResetSchema,
        { tokenHash: hashToken(token) },
        { populate: ['user'], lockMode: LockMode.PESSIMISTIC_WRITE /* single use */ },
      );
      if (!reset || reset.usedAt || reset.expiresAt < new Date()) {
        throw new NotFoundError(
          'this password link was used already or has expired; ask for a new one',
        );
      }
      assertStrongPassword(body.password, [reset.user.email, reset.user.displayName], 'password');
      reset.user.passwordHash = await hashPassword(body.password);
      reset.usedAt = new Date();
      // Older links of the same account stop working too.
      await tem.nativeUpdate(
        PasswordResetSchema,
        { user: reset.user.id, usedAt: null },
        { usedAt: new Date() },
      );
      return reset.user.id;
    });
    await endSessionsOf(services.sessionPool, config.dbSchema, userId);
    res.status(204).end();
  });

  return router;
}
