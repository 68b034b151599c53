import type { RequestHandler } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import { csrfSync, type CsrfSync } from 'csrf-sync';
import { Passport } from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { rateLimit } from 'express-rate-limit';
import { SESSION_TABLE } from '../mikro-orm.config';
import { ForbiddenError } from '../common/errors';
import { PgRateLimitStore } from '../common/pg-rate-limit-store';
import type { Services } from '../common/services';
import { UserSchema } from '../users/user.entity';
import { hashPassword, verifyPassword } from '../users/password';
import { readAnonToken, storeAnonToken } from './anon-csrf';
import { CachedSessionStore } from './session-cache';
import { findUser } from './user-cache';
import '../common/request-types';
import { CSRF_ERROR_CODE } from './csrf-code';

/** Name of the session cookie (ours, not the library default, which names the stack). */
export const SESSION_COOKIE = 'cw_session';
const SESSION_DAYS = 14;

/** How long a session lasts after it was last rolled, ms. */
export const SESSION_MS = SESSION_DAYS * 24 * 3600 * 1000;
/** A session in use rolls forward at most once in this time, ms. */
export const SESSION_ROLL_MS = 24 * 3600 * 1000;

declare module 'express-session' {
  interface SessionData {
    /** When the session last rolled forward (a change, so the store writes it). */
    rolledAt?: number;
  }
}

/**
 * Session middleware backed by PostgreSQL. A request writes the session row only when the
 * session changed (sign-in, CSRF token) or rolls (see `rollSession`), not on every request:
 * no `rolling`, and the store's touch is off. Nor does it read the row on every request:
 * a read stays fresh for a couple of seconds.
 */
export function sessionMiddleware(services: Services): RequestHandler {
  const PgStore = connectPgSimple(session);
  const { config } = services;
  return session({
    name: SESSION_COOKIE,
    secret: config.sessionSecret,
    resave: false,
    saveUninitialized: false,
    rolling: false,
    // Reads cached for a moment in-process (./session-cache.ts): one read every few seconds
    // for a busy client rather than one per request.
    store: new CachedSessionStore(
      new PgStore({
        pool: services.sessionPool,
        tableName: SESSION_TABLE,
        schemaName: config.dbSchema,
        disableTouch: true,
        // Jest must be able to exit: no pruning timer in tests.
        pruneSessionInterval: config.pruneSessions ? 15 * 60 : false,
      }),
    ),
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure: config.cookieSecure,
      maxAge: SESSION_MS,
    },
  });
}

// Checked against when no account has the address, so an unknown address takes as long
// as a wrong password (the answer time tells nothing about who has an account).
let dummyHash: Promise<string> | undefined;
const dummyPasswordHash = () => (dummyHash ??= hashPassword('no-account-has-this-password'));

/**
 * Rolls a stored session forward (14 days from now, cookie and row) once it is a day past
 * its last roll: a session in daily use never expires, and a busy client costs one write
 * a day instead of one per request.
 */
export const rollSession: RequestHandler = (req, _res, next) => {
  const cookie = req.session?.cookie;
  const left = cookie?.maxAge;
  if (cookie && typeof left === 'number' && SESSION_MS - left > SESSION_ROLL_MS) {
    req.session.touch();
    req.session.rolledAt = Date.now();
  }
  next();
};

/**
 * A passport instance of the app's own (not the module-wide singleton) with the local
 * strategy: e-mail + password. The session keeps only the user id.
 */
export function createPassport(em: EntityManager): InstanceType<typeof Passport> {
  const passport = new Passport();
  passport.use(
    new LocalStrategy(
      { usernameField: 'email', passwordField: 'password' },
      (email, password, done) => {
        em.findOne(UserSchema, { email: email.trim().toLowerCase() })
          .then(async (user) => {
            const ok = user
              ? await verifyPassword(password, user.passwordHash)
              : (await verifyPassword(password, await dummyPasswordHash())) && false;
            // Said only to someone who knows the password, so it reveals no account.
            if (ok && user!.deactivatedAt) {
              done(
                new ForbiddenError(
                  'this account is deactivated; ask a site admin to reactivate it',
                  'account-deactivated',
                ),
              );
              return;
            }
            done(null, ok ? user! : false);
          })
          .catch(done);
      },
    ),
  );
  passport.serializeUser((user, done) => done(null, user.id));
  passport.deserializeUser((id: string, done) => {
    // A deactivated or deleted account's sessions end: it is signed out on its next request.
    // Kept in memory for a moment (./user-cache.ts), forgotten whenever accounts change.
    findUser(em, id)
      .then((user) => done(null, user && !user.deactivatedAt ? user : false))
      .catch(done);
  });
  return passport;
}

/**
 * Synchroniser-token CSRF protection: the client sends the token in `x-csrf-token`. A
 * signed-in user's token lives in the session; a visitor's in a signed cookie (anon-csrf.ts).
 */
export function createCsrf(secret: string, secureCookie = false): CsrfSync {
  return csrfSync({
    getTokenFromState: (req) => (req.user ? req.session.csrfToken : readAnonToken(req, secret)),
    storeTokenInState: (req, token) => {
      if (req.user) req.session.csrfToken = token;
      else storeAnonToken(req, token, secret, secureCookie);
    },
    getTokenFromRequest: (req) => {
      const header = req.headers['x-csrf-token'];
      return typeof header === 'string' ? header : undefined;
    },
    errorConfig: {
      statusCode: 403,
      code: CSRF_ERROR_CODE,
      message:
        'missing or wrong CSRF token: GET /api/auth/csrf and send its token in the x-csrf-token header',
    },
  });
}

/**
 * Limits failed sign-in attempts per client address; successful ones do not count. The
 * counters are in PostgreSQL, so the limit holds across restarts and server processes.
 */
export function signInLimiter(services: Services): RequestHandler {
  const { windowMs, limit } = services.config.signInLimit;
  return rateLimit({
    windowMs,
    limit,
    store: new PgRateLimitStore(services.orm, 'signin', services.config.dbSchema),
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    handler: (_req, res) => {
      res.status(429).json({
        error: 'too-many-attempts',
        message: `too many failed sign-ins from this address; wait ${Math.ceil(windowMs / 60000)} minutes and try again`,
      });
    },
  });
}
