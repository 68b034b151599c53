/** Bad requests get a JSON answer that says what to fix; nothing crashes. */
import request from 'supertest';
import { anonymous, createUser, send, signIn, type Client } from './support/agents';
import path from 'node:path';
import { createTestContext, FIXTURES, type TestContext } from './support/test-db';

let ctx: TestContext;
let user: Client;

beforeAll(async () => {
  ctx = await createTestContext({ bodyLimitBytes: 64 * 1024 });
  await createUser(ctx.services.orm.em.fork(), 'someone@errors.test');
  user = await signIn(ctx.app, 'someone@errors.test');
});
afterAll(() => ctx.close());

describe('request bodies', () => {
  it('should answer 400 for malformed JSON', async () => {
    const res = await user.agent
      .post('/api/workspaces')
      .set('x-csrf-token', user.csrf)
      .set('content-type', 'application/json')
      .send('{"name": "unterminated');
    expect(res.status).toBe(400);
    expect(res.body).toMatchObject({ error: 'malformed-json' });
  });

  it('should answer 413 for a body over the limit', async () => {
    const res = await send(user, 'post', '/api/analysis', { padding: 'x'.repeat(70 * 1024) });
    expect(res.status).toBe(413);
    expect(res.body.error).toBe('too-large');
    expect(res.body.message).toContain(String(64 * 1024));
  });

  it('should answer 422 with every field at fault', async () => {
    const res = await send(user, 'post', '/api/workspaces', { name: '' });
    expect(res.status).toBe(422);
    expect(res.body).toMatchObject({
      error: 'invalid',
      details: [{ path: 'name', message: 'a workspace needs a name' }],
    });
  });

  it('should answer 422 for text PostgreSQL cannot store, naming the field', async () => {
    const res = await send(user, 'post', '/api/workspaces', { name: 'bad\u0000name' });
    expect(res.status).toBe(422);
    expect(res.body.details).toEqual([
      { path: 'name', message: 'text may not contain the NUL character (U+0000)' },
    ]);
  });

  it('should answer 422 for a missing body', async () => {
    const res = await user.agent.post('/api/workspaces').set('x-csrf-token', user.csrf);
    expect(res.status).toBe(422);
    expect(res.body.details[0].path).toBe('(body)');
  });
});

describe('CSRF', () => {
  it('should refuse a state-changing request without the token', async () => {
    const res = await user.agent.post('/api/workspaces').send({ name: 'Sneaky' });
    expect(res.status).toBe(403);
    expect(res.body).toMatchObject({ error: 'csrf' });
    expect(res.body.message).toContain('x-csrf-token');
  });

  it('should refuse a wrong token', async () => {
    const res = await user.agent
      .post('/api/workspaces')
      .set('x-csrf-token', 'forged')
      .send({ name: 'Sneaky' });
    expect(res.status).toBe(403);
  });

  it('should refuse a sign-in without the token', async () => {
    const res = await request(ctx.app)
      .post('/api/auth/login')
      .send({ email: 'someone@errors.test', password: 'correct-horse-battery' });
    expect(res.status).toBe(403);
  });
});

describe('routing', () => {
  it('should answer JSON 404 for an unknown API path, even anonymously', async () => {
    const res = await request(ctx.app).get('/api/no/such/thing');
    expect(res.status).toBe(404);
    expect(res.body).toMatchObject({ error: 'no-such-route' });
  });

  it('should serve the client index for other paths, with the content security policy', async () => {
    const res = await request(ctx.app).get('/workspaces/abc/chains');
    expect(res.status).toBe(200);
    expect(res.text).toContain('test client shell');
    const csp = res.headers['content-security-policy'];
    expect(csp).toContain("script-src 'self'");
    expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/);
    expect(csp).toContain("img-src 'self' data: blob:");
  });

  it('should set an httpOnly, SameSite=Lax session cookie of our own name', async () => {
    const client = await anonymous(ctx.app);
    const res = await client.agent
      .post('/api/auth/login')
      .set('x-csrf-token', client.csrf)
      .send({ email: 'someone@errors.test', password: 'correct-horse-battery' });
    const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).join(';');
    expect(cookie).toMatch(/^cw_session=/);
    expect(cookie).toContain('HttpOnly');
    expect(cookie).toContain('SameSite=Lax');
  });

  it('should say the client is not built, instead of a bare 404, when it is missing', async () => {
    const bare = await createTestContext({ clientDir: path.join(FIXTURES, 'no-such-build') });
    try {
      const res = await request(bare.app).get('/');
      expect(res.status).toBe(503);
      expect(res.text).toContain('npm start');
    } finally {
      await bare.close();
    }
  });
});
