/** Registration, sign-in and out, password change, closed registration, rate limit. */
import request from 'supertest';
import { anonymous, createUser, send, signIn } from './support/agents';
import * as passwords from '../../server/users/password';
import { SESSION_TABLE } from '../../server/mikro-orm.config';
import { linkFrom, recordMail, waitForMail } from './support/mail';
import { createTestContext, type TestContext } from './support/test-db';

const register = async (ctx: TestContext, email: string, password = 'long-enough-pass') => {
  const client = await anonymous(ctx.app);
  const res = await send(client, 'post', '/api/auth/register', {
    email,
    displayName: email.split('@')[0],
    password,
  });
  return { client, res };
};

describe('registration', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await createTestContext();
    recordMail(ctx);
  });
  afterAll(() => ctx.close());

  it('should make the first account of an empty site its admin, and sign it in', async () => {
    const { client, res } = await register(ctx, 'First@Site.test');
    expect(res.status).toBe(201);
    expect(res.body.user).toMatchObject({ email: 'first@site.test', siteRole: 'admin' });
    expect(typeof res.body.csrfToken).toBe('string');
    const me = await client.agent.get('/api/me');
    expect(me.body).toMatchObject({ user: { email: 'first@site.test' }, memberships: [] });
    // The answer's token is the session's token now.
    const ws = await client.agent
      .post('/api/workspaces')
      .set('x-csrf-token', res.body.csrfToken)
      .send({ name: 'Mine' });
    expect(ws.status).toBe(201);
  });

  it('should make only one of two simultaneous first sign-ups the admin', async () => {
    const fresh = await createTestContext();
    recordMail(fresh);
    try {
      const [a, b] = await Promise.all([
        register(fresh, 'a@race.test'),
        register(fresh, 'b@race.test'),
      ]);
      // One becomes the admin at once; the other must confirm its address first.
      expect([a.res.status, b.res.status].sort()).toEqual([201, 202]);
      const [first, second] = a.res.status === 201 ? [a, b] : [b, a];
      expect(first.res.body.user.siteRole).toBe('admin');
      const secondEmail = first === a ? 'b@race.test' : 'a@race.test';
      expect(second.res.body.pending).toBe(true);
      await waitForMail(fresh, secondEmail, 'Confirm your address');
    } finally {
      await fresh.close();
    }
  });

  it('should let a later account sign in only after its address is confirmed by mail', async () => {
    const { client, res } = await register(ctx, 'second@site.test');
    expect(res.status).toBe(202);
    expect(res.body.pending).toBe(true);
    const refused = await send(client, 'post', '/api/auth/login', {
      email: 'second@site.test',
      password: 'long-enough-pass',
    });
    expect(refused.status).toBe(401);
    const mail = await waitForMail(ctx, 'second@site.test', 'Confirm your address');
    const token = linkFrom(mail.text, '/confirm/');
    const confirmed = await send(client, 'post', `/api/auth/confirm/${token}`);
    expect(confirmed.status).toBe(201);
    expect(confirmed.body.user).toMatchObject({ email: 'second@site.test', siteRole: 'user' });
    // The link works once.
    const again = await anonymous(ctx.app);
    expect((await send(again, 'post', `/api/auth/confirm/${token}`)).status).toBe(404);
    await expect(signIn(ctx.app, 'second@site.test', 'long-enough-pass')).resolves.toBeDefined();
  });

  it('should answer a taken address exactly like a new one, and tell its owner by mail', async () => {
    const { res } = await register(ctx, 'SECOND@site.test');
    expect(res.status).toBe(202);
    expect(res.body.pending).toBe(true);
    await waitForMail(ctx, 'second@site.test', 'You already have a Chainwright account');
  });

  it('should answer 422 for a password the estimator finds easy to guess', async () => {
    const { res } = await register(ctx, 'weak@site.test', 'password1234');
    expect(res.status).toBe(422);
    expect(res.body.details[0].path).toBe('password');
    expect(res.body.details[0].message).toContain('too easy to guess');
  });

  it('should answer 422 for a short password', async () => {
    const { res } = await register(ctx, 'third@site.test', 'short');
    expect(res.status).toBe(422);
    expect(res.body.details).toContainEqual({
      path: 'password',
      message: 'a password needs at least 10 characters',
    });
  });

  it('should refuse registration with 403 once the admin closes it', async () => {
    const admin = await signIn(ctx.app, 'first@site.test', 'long-enough-pass');
    const closed = await send(admin, 'patch', '/api/admin/settings', { openRegistration: false });
    expect(closed.body).toEqual({ openRegistration: false });
    expect((await request(ctx.app).get('/api/auth/registration')).body).toEqual({
      openRegistration: false,
    });
    const { res } = await register(ctx, 'late@site.test');
    expect(res.status).toBe(403);
    expect(res.body.error).toBe('registration-closed');
    await send(admin, 'patch', '/api/admin/settings', { openRegistration: true }).expect(200);
    expect((await register(ctx, 'late@site.test')).res.status).toBe(202);
  });
});

describe('signing in and out', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await createTestContext();
    await createUser(ctx.services.orm.em.fork(), 'pat@auth.test');
  });
  afterAll(() => ctx.close());

  it('should answer 401 for a wrong password, without saying which part was wrong', async () => {
    const client = await anonymous(ctx.app);
    const res = await send(client, 'post', '/api/auth/login', {
      email: 'pat@auth.test',
      password: 'wrong-password',
    });
    expect(res.status).toBe(401);
    expect(res.body.message).toBe('wrong e-mail or password');
    const unknown = await send(client, 'post', '/api/auth/login', {
      email: 'nobody@auth.test',
      password: 'whatever-1',
    });
    expect(unknown.body.message).toBe('wrong e-mail or password');
  });

  it('should give a new CSRF token at sign-in, refusing the old one', async () => {
    const client = await anonymous(ctx.app);
    const res = await send(client, 'post', '/api/auth/login', {
      email: 'pat@auth.test',
      password: 'correct-horse-battery',
    });
    expect(res.status).toBe(200);
    expect(res.body.csrfToken).not.toBe(client.csrf);
    const withOld = await client.agent
      .post('/api/workspaces')
      .set('x-csrf-token', client.csrf)
      .send({ name: 'x' });
    expect(withOld.status).toBe(403);
  });

  it('should sign out so the session no longer reads', async () => {
    const client = await signIn(ctx.app, 'pat@auth.test');
    expect((await client.agent.get('/api/me')).status).toBe(200);
    expect((await send(client, 'post', '/api/auth/logout')).status).toBe(204);
    expect((await client.agent.get('/api/me')).status).toBe(401);
  });

  it('should change the password after checking the current one', async () => {
    await createUser(ctx.services.orm.em.fork(), 'kim@auth.test');
    const client = await signIn(ctx.app, 'kim@auth.test');
    const wrong = await send(client, 'post', '/api/auth/password', {
      currentPassword: 'not-it-at-all',
      newPassword: 'a-brand-new-one',
    });
    expect(wrong.status).toBe(422);
    expect(wrong.body.details[0].path).toBe('currentPassword');
    const ok = await send(client, 'post', '/api/auth/password', {
      currentPassword: 'correct-horse-battery',
      newPassword: 'a-brand-new-one',
    });
    expect(ok.status).toBe(204);
    await expect(signIn(ctx.app, 'kim@auth.test')).rejects.toThrow('401');
    await expect(signIn(ctx.app, 'kim@auth.test', 'a-brand-new-one')).resolves.toBeDefined();
  });

  it("should end the account's other sessions on a password change, keeping the caller's", async () => {
    await createUser(ctx.services.orm.em.fork(), 'ola@auth.test');
    const here = await signIn(ctx.app, 'ola@auth.test');
    const elsewhere = await signIn(ctx.app, 'ola@auth.test');
    const other = await signIn(ctx.app, 'pat@auth.test');
    await send(here, 'post', '/api/auth/password', {
      currentPassword: 'correct-horse-battery',
      newPassword: 'tuned-circuit-ratio',
    }).expect(204);
    expect((await here.agent.get('/api/me')).status).toBe(200);
    expect((await elsewhere.agent.get('/api/me')).status).toBe(401);
    expect((await other.agent.get('/api/me')).status).toBe(200);
  });

  it('should refuse a new password the estimator finds easy to guess', async () => {
    await createUser(ctx.services.orm.em.fork(), 'una@auth.test');
    const client = await signIn(ctx.app, 'una@auth.test');
    const res = await send(client, 'post', '/api/auth/password', {
      currentPassword: 'correct-horse-battery',
      newPassword: 'aaaaaaaaaaaa',
    });
    expect(res.status).toBe(422);
    expect(res.body.details[0].path).toBe('newPassword');
  });

  it('should hash a stand-in password for an unknown address, as for a known one', async () => {
    const verify = jest.spyOn(passwords, 'verifyPassword');
    try {
      const client = await anonymous(ctx.app);
      await send(client, 'post', '/api/auth/login', {
        email: 'nobody-here@auth.test',
        password: 'whatever-it-is',
      }).expect(401);
      // The same scrypt work is done, so the answer takes as long as for a wrong password.
      expect(verify).toHaveBeenCalledTimes(1);
      expect(verify.mock.calls[0][0]).toBe('whatever-it-is');
    } finally {
      verify.mockRestore();
    }
  });

  it('should store no session row when a signed-out visitor asks for a CSRF token', async () => {
    const count = async () =>
      Number(
        (
          await ctx.services.sessionPool.query(
            `select count(*) as n from "${ctx.schema}"."${SESSION_TABLE}"`,
          )
        ).rows[0].n,
      );
    const before = await count();
    const visitor = await anonymous(ctx.app);
    await visitor.agent.get('/api/auth/csrf').expect(200);
    expect(await count()).toBe(before);
    // The token still guards a state-changing request: wrong or missing is refused.
    const noToken = await visitor.agent
      .post('/api/auth/login')
      .send({ email: 'pat@auth.test', password: 'correct-horse-battery' });
    expect(noToken.status).toBe(403);
    const ok = await send(visitor, 'post', '/api/auth/login', {
      email: 'pat@auth.test',
      password: 'correct-horse-battery',
    });
    expect(ok.status).toBe(200);
    expect(await count()).toBe(before + 1);
  });
});

describe('sign-in rate limit', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await createTestContext({ signInLimit: { windowMs: 60_000, limit: 3 } });
    await createUser(ctx.services.orm.em.fork(), 'lee@auth.test');
  });
  afterAll(() => ctx.close());

  it('should answer 429 with a JSON message after too many failed attempts', async () => {
    const client = await anonymous(ctx.app);
    const attempt = () =>
      send(client, 'post', '/api/auth/login', { email: 'lee@auth.test', password: 'guess-guess' });
    for (let i = 0; i < 3; i++) expect((await attempt()).status).toBe(401);
    const blocked = await attempt();
    expect(blocked.status).toBe(429);
    expect(blocked.body.error).toBe('too-many-attempts');
    expect(blocked.body.message).toContain('wait');
    // Even the right password waits out the window.
    const right = await send(client, 'post', '/api/auth/login', {
      email: 'lee@auth.test',
      password: 'correct-horse-battery',
    });
    expect(right.status).toBe(429);
  });
});

describe('password change limit', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await createTestContext({ signInLimit: { windowMs: 60_000, limit: 3 } });
    await createUser(ctx.services.orm.em.fork(), 'max@auth.test');
  });
  afterAll(() => ctx.close());

  it('should limit password changes like sign-ins', async () => {
    const client = await signIn(ctx.app, 'max@auth.test');
    const attempt = () =>
      send(client, 'post', '/api/auth/password', {
        currentPassword: 'a-wrong-guess',
        newPassword: 'tuned-circuit-ratio',
      });
    for (let i = 0; i < 3; i++) expect((await attempt()).status).toBe(422);
    const blocked = await attempt();
    expect(blocked.status).toBe(429);
    expect(blocked.body.error).toBe('too-many-attempts');
  });
});
