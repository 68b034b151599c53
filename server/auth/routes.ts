import { Router, type NextFunction, type Request, type Response } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { CsrfSync } from 'csrf-sync';
import type { Passport } from 'passport';
import {
  changePasswordSchema,
  loginSchema,
  registerSchema,
  type SignedInDto,
} from '../../shared/schema/api';
import {
  ConflictError,
  ForbiddenError,
  UnauthorizedError,
  ValidationError,
} from '../common/errors';
import { currentUser } from '../common/roles';
import { parseOr422 } from '../common/validate';
import { toUserDto } from '../users/dto';
import { hashPassword, verifyPassword } from '../users/password';
import { siteSettings } from '../users/site-settings';
import { UserSchema, type User } from '../users/user.entity';

interface AuthDeps {
  em: EntityManager;
  passport: InstanceType<typeof Passport>;
  csrf: CsrfSync;
  signInLimiter: (req: Request, res: Response, next: NextFunction) => void;
}

/** Signs `user` in (passport regenerates the session) and answers with a fresh CSRF token. */
async function signIn(req: Request, res: Response, user: User, csrf: CsrfSync, status: number) {
  await new Promise<void>((resolve, reject) =>
    req.login(user, (err) => (err ? reject(err) : resolve())),
  );
  const body: SignedInDto = { user: toUserDto(user), csrfToken: csrf.generateToken(req, true) };
  res.status(status).json(body);
}

/** /api/auth: register, sign in and out, password, CSRF token. */
export function authRouter({ em, passport, csrf, signInLimiter }: AuthDeps): Router {
  const router = Router();

  router.get('/csrf', (req, res) => {
    res.json({ token: csrf.generateToken(req) });
  });

  /** Whether the sign-in screen should offer registration (public). */
  router.get('/registration', async (_req, res) => {
    res.json({ openRegistration: (await siteSettings(em)).openRegistration });
  });

  router.post('/register', signInLimiter, async (req, res) => {
    const body = parseOr422(registerSchema, req.body);
    const passwordHash = await hashPassword(body.password);
    // One registration at a time (a transaction-scoped advisory lock), so two first
    // sign-ups on an empty site cannot both become its admin.
    const user = await em.transactional(async (tem) => {
      await tem.execute(`select pg_advisory_xact_lock(hashtext('chainwright:register'))`);
      const userCount = await tem.count(UserSchema);
      if (userCount > 0 && !(await siteSettings(tem)).openRegistration) {
        throw new ForbiddenError(
          'registration is closed on this site; ask an admin for an account',
          'registration-closed',
        );
      }
      if (await tem.findOne(UserSchema, { email: body.email })) {
        throw new ConflictError(
          'email-taken',
          'an account with this e-mail exists already; sign in instead',
        );
      }
      return tem.create(UserSchema, {
        email: body.email,
        displayName: body.displayName,
        passwordHash,
        // The first account of a new site runs it.
        siteRole: userCount === 0 ? 'admin' : 'user',
      });
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

  router.post('/password', async (req, res) => {
    const user = currentUser(req);
    const body = parseOr422(changePasswordSchema, req.body);
    if (!(await verifyPassword(body.currentPassword, user.passwordHash))) {
      throw new ValidationError('the current password is wrong', [
        { path: 'currentPassword', message: 'the current password is wrong' },
      ]);
    }
    user.passwordHash = await hashPassword(body.newPassword);
    await em.flush();
    res.status(204).end();
  });

  return router;
}
