import { Router, type NextFunction, type Request, type Response } from 'express';
import { LockMode } from '@mikro-orm/core';
import type { CsrfSync } from 'csrf-sync';
import type { Passport } from 'passport';
import {
  changePasswordSchema,
  loginSchema,
  registerSchema,
  type RegistrationPendingDto,
  type SignedInDto,
} from '../../shared/schema/api';
import {
  ConflictError,
  ForbiddenError,
  NotFoundError,
  UnauthorizedError,
  ValidationError,
} from '../common/errors';
import { currentUser } from '../common/roles';
import type { Services } from '../common/services';
import { parseOr422 } from '../common/validate';
import { publicBaseUrl } from '../config';
import { messages } from '../mail/messages';
import { toUserDto } from '../users/dto';
import { hashPassword, verifyPassword } from '../users/password';
import { siteSettings } from '../users/site-settings';
import { UserSchema, type User } from '../users/user.entity';
import { CONFIRM_HOURS, PendingRegistrationSchema } from './account-token.entity';
import { endSessionsOf } from './other-sessions';
import { afterAnswer } from './after-answer';
import { passwordResetRoutes } from './password-reset';
import { assertStrongPassword } from './strength';
import { looksLikeToken, newToken, hashToken } from './tokens';

interface AuthDeps {
  services: Services;
  passport: InstanceType<typeof Passport>;
  csrf: CsrfSync;
  signInLimiter: (req: Request, res: Response, next: NextFunction) => void;
}

/** Signs `user` in (passport regenerates the session) and answers with a fresh CSRF token. */
export async function signIn(
  req: Request,
  res: Response,
  user: User,
  csrf: CsrfSync,
  status: number,
  extra: object = {},
) {
  await new Promise<void>((resolve, reject) =>
    req.login(user, (err) => (err ? reject(err) : resolve())),
  );
  const body: SignedInDto = { user: toUserDto(user), csrfToken: csrf.generateToken(req, true) };
  res.status(status).json({ ...body, ...extra });
}

const PENDING_ANSWER: RegistrationPendingDto = {
  pending: true,
  message:
    'check your mail: open the link we sent to confirm the address, then your account is ready',
};

/** /api/auth: register (with address confirmation), sign in and out, passwords, CSRF token. */
export function authRouter({ services, passport, csrf, signInLimiter }: AuthDeps): Router {
  const router = Router();
  const { em, config } = services;
  const base = publicBaseUrl(config);

  router.get('/csrf', (req, res) => {
    res.json({ token: csrf.generateToken(req) });
  });

  /** Whether the sign-in screen should offer registration (public). */
  router.get('/registration', async (_req, res) => {
    res.json({ openRegistration: (await siteSettings(em)).openRegistration });
  });

  router.post('/register', signInLimiter, async (req, res) => {
    const body = parseOr422(registerSchema, req.body);
    assertStrongPassword(body.password, [body.email, body.displayName], 'password');
    const passwordHash = await hashPassword(body.password);
    // One registration at a time (a transaction-scoped advisory lock), so two first
    // sign-ups on an empty site cannot both become its admin.
    const outcome = await em.transactional(async (tem) => {
      await tem.execute(`select pg_advisory_xact_lock(hashtext('chainwright:register'))`);
      const userCount = await tem.count(UserSchema);
      if (userCount === 0) {
        // The first account of a new site runs it; there is nobody to confirm it to.
        const admin = tem.create(UserSchema, {
          email: body.email,
          displayName: body.displayName,
          passwordHash,
          siteRole: 'admin',
        });
        return { admin };
      }
      if (!(await siteSettings(tem)).openRegistration) {
        throw new ForbiddenError(
          'registration is closed on this site; ask an admin for an account',
          'registration-closed',
        );
      }
      if (await tem.findOne(UserSchema, { email: body.email })) return { taken: true };
      const { token, hash } = newToken();
      tem.create(PendingRegistrationSchema, {
        email: body.email,
        displayName: body.displayName,
        passwordHash,
        tokenHash: hash,
        expiresAt: new Date(Date.now() + CONFIRM_HOURS * 3600_000),
      });
      return { token };
    });
    if ('admin' in outcome && outcome.admin) {
      await signIn(req, res, outcome.admin, csrf, 201);
      return;
    }
    // The same answer whether or not the address has an account; the mail says which.
    res.status(202).json(PENDING_ANSWER);
    afterAnswer(res, 'registration mail', () =>
      services.mail.send(
        em,
        'token' in outcome && outcome.token
          ? messages.confirmAddress(body.email, {
              name: body.displayName,
              url: `${base}/confirm/${outcome.token}`,
            })
          : messages.alreadyRegistered(body.email, {
              signInUrl: `${base}/sign-in`,
              resetUrl: `${base}/forgot-password`,
            }),
      ),
    );
  });

  /** Opens the link from the confirmation mail: creates the account and signs it in. */
  router.post('/confirm/:token', signInLimiter, async (req, res) => {
    const token = req.params.token;
    if (!looksLikeToken(token)) throw new NotFoundError('this confirmation link is not valid');
    const user = await em.transactional(async (tem) => {
      const pending = await tem.findOne(
        PendingRegistrationSchema,
        { tokenHash: hashToken(token) },
        { lockMode: LockMode.PESSIMISTIC_WRITE },
      );
      if (!pending || pending.expiresAt < new Date()) {
        throw new NotFoundError(
          'this confirmation link was used already or has expired; sign up again to get a new one',
        );
      }
      if (await tem.findOne(UserSchema, { email: pending.email })) {
        await tem.nativeDelete(PendingRegistrationSchema, { email: pending.email });
        throw new ConflictError(
          'email-taken',
          'this address has an account already; sign in instead',
        );
      }
      const created = tem.create(UserSchema, {
        email: pending.email,
        displayName: pending.displayName,
        passwordHash: pending.passwordHash,
        siteRole: 'user',
      });
      await tem.nativeDelete(PendingRegistrationSchema, { email: pending.email });
      return created;
    });
    await signIn(req, res, user, csrf, 201);
  });

  router.post('/login', signInLimiter, async (req, res, next) => {
    parseOr422(loginSchema, req.body);
    const user = await new Promise<User | false>((resolve, reject) =>
      passport.authenticate('local', (err: unknown, found: User | false) =>
        err ? reject(err) : resolve(found),
      )(req, res, next),
    );
    if (!user) throw new UnauthorizedError('wrong e-mail or password');
    await signIn(req, res, user, csrf, 200);
  });

  router.post('/logout', async (req, res) => {
    await new Promise<void>((resolve, reject) =>
      req.logout((err) => (err ? reject(err) : resolve())),
    );
    res.status(204).end();
  });

  // Limited like sign-in: a stolen session must not be able to guess the current password.
  router.post('/password', signInLimiter, async (req, res) => {
    const user = currentUser(req);
    const body = parseOr422(changePasswordSchema, req.body);
    if (!(await verifyPassword(body.currentPassword, user.passwordHash))) {
      throw new ValidationError('the current password is wrong', [
        { path: 'currentPassword', message: 'the current password is wrong' },
      ]);
    }
    assertStrongPassword(body.newPassword, [user.email, user.displayName], 'newPassword');
    user.passwordHash = await hashPassword(body.newPassword);
    await em.flush();
    // Whoever else holds a session of this account (another browser, a thief) is out.
    await endSessionsOf(services.sessionPool, config.dbSchema, user.id, req.sessionID);
    res.status(204).end();
  });

  router.use('/password-reset', passwordResetRoutes(services, signInLimiter));
  return router;
}
