/** Registration, sign-in and out, password change, closed registration, rate limit. */
import request from 'supertest';
import { anonymous, createUser, send, signIn } from './support/agents';
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
    try {
      const [a, b] = await Promise.all([
        register(fresh, 'a@race.test'),
        register(fresh, 'b@race.test'),
      ]);
      expect([a.res.status, b.res.status]).toEqual([201, 201]);
      expect([a.res.body.user.siteRole, b.res.body.user.siteRole].sort()).toEqual([
        'admin',
        'user',
      ]);
    } finally {
      await fresh.close();
    }
  });

  it('should make later accounts plain users', async () => {
    const { res } = await register(ctx, 'second@site.test');
    expect(res.status).toBe(201);
    expect(res.body.user.siteRole).toBe('user');
  });

  it('should answer 409 for an e-mail address already registered', async () => {
    const { res } = await register(ctx, 'SECOND@site.test');
    expect(res.status).toBe(409);
    expect(res.body.error).toBe('email-taken');
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
    expect((await register(ctx, 'late@site.test')).res.status).toBe(201);
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
