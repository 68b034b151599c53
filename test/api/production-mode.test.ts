/**
 * Production mode (NODE_ENV=production or CW_MODE=production): refuses default secrets and
 * a missing TLS proxy, sends Secure cookies only over HTTPS from a trusted proxy, trusts
 * only the proxies configured, loads no demo data. Without it the server is in demo mode.
 */
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import request from 'supertest';
import { createApp } from '../../server/app';
import { ConfigError, configFromEnv, REPO_ROOT } from '../../server/config';
import { initServices, mailTransport, type Services } from '../../server/common/services';
import { createUser, PASSWORD } from './support/agents';
import { createTestContext, testConfig, type TestContext } from './support/test-db';

jest.setTimeout(60_000);

const GOOD_SECRET = 'k3J9-vq2LmX8-pR4tZ7wY1-nB6cD5fG0-hS2';
const base = { DATABASE_URL: 'postgresql://app@127.0.0.1:1/none' };

describe('production settings', () => {
  it('should be demo mode unless asked for production', () => {
    expect(configFromEnv(base).mode).toBe('demo');
    expect(configFromEnv({ ...base, NODE_ENV: 'development' }).mode).toBe('demo');
  });

  it.each([
    ['NODE_ENV', { NODE_ENV: 'production' }],
    ['CW_MODE', { CW_MODE: 'production' }],
  ])('should refuse to start via %s without a secret and a trusted proxy', (_n, env) => {
    expect(() => configFromEnv({ ...base, ...env })).toThrow(ConfigError);
    expect(() => configFromEnv({ ...base, ...env })).toThrow(
      /CW_SESSION_SECRET[\s\S]*CW_TRUST_PROXY/,
    );
  });

  it.each(['changeme', 'secret', 'x'.repeat(40), 'short-but-random-9f2'])(
    'should refuse the session secret %s',
    (secret) => {
      const env = { ...base, NODE_ENV: 'production', CW_TRUST_PROXY: 'loopback' };
      expect(() => configFromEnv({ ...env, CW_SESSION_SECRET: secret })).toThrow(
        /CW_SESSION_SECRET is a default or too short/,
      );
    },
  );

  it('should start with a real secret and a proxy, with Secure cookies and no mail catcher', () => {
    const config = configFromEnv({
      ...base,
      NODE_ENV: 'production',
      CW_SESSION_SECRET: GOOD_SECRET,
      CW_TRUST_PROXY: 'loopback',
      CW_SMTP_PORT: '2530',
    });
    expect(config).toMatchObject({
      mode: 'production',
      cookieSecure: true,
      trustProxyAddresses: 'loopback',
      // A port alone names the demo catcher: production sends mail only to a relay it is given.
      mail: { kind: 'json' },
    });
    expect(() =>
      configFromEnv({
        ...base,
        CW_MODE: 'production',
        CW_SESSION_SECRET: GOOD_SECRET,
        CW_TRUST_PROXY_HOPS: '1',
        CW_COOKIE_SECURE: '0',
      }),
    ).toThrow(/CW_COOKIE_SECURE=0/);
  });

  it('should send through the relay SMTP_URL names, in production and in demo mode', () => {
    const prod = {
      ...base,
      NODE_ENV: 'production',
      CW_SESSION_SECRET: GOOD_SECRET,
      CW_TRUST_PROXY: 'loopback',
    };
    const url = 'smtp://mailer:pw@relay.example.org:587';
    expect(configFromEnv({ ...prod, SMTP_URL: url }).mail).toEqual({ kind: 'relay', url });
    expect(configFromEnv({ ...prod, CW_SMTP_HOST: 'relay.example.org' }).mail).toEqual({
      kind: 'relay',
      url: 'smtp://relay.example.org:25',
    });
    // Named explicitly, a relay wins over the demo catcher.
    expect(configFromEnv({ ...base, SMTP_URL: url, CW_SMTP_PORT: '2530' }).mail).toEqual({
      kind: 'relay',
      url,
    });
    expect(configFromEnv({ ...base, CW_SMTP_PORT: '2530' }).mail).toMatchObject({
      kind: 'smtp',
      port: 2530,
    });
    // The relay's transport is a real SMTP one: STARTTLS is not switched off.
    const relay = mailTransport({ kind: 'relay', url }) as unknown as {
      options: { host: string; port: number; ignoreTLS?: boolean };
    };
    expect(relay.options).toMatchObject({ host: 'relay.example.org', port: 587 });
    expect(relay.options.ignoreTLS).toBeFalsy();
  });

  it('should refuse to start the server process, saying what to set', () => {
    const run = spawnSync(
      process.execPath,
      ['--import', 'tsx', path.join(REPO_ROOT, 'server', 'main.ts')],
      {
        env: {
          ...process.env,
          ...base,
          NODE_ENV: 'production',
          CW_SESSION_SECRET: 'changeme',
          PORT: '0',
        },
        encoding: 'utf8',
        timeout: 50_000,
      },
    );
    expect(run.status).toBe(1);
    expect(run.stderr).toContain('production mode refuses to start');
    expect(run.stderr).toContain('CW_SESSION_SECRET');
  });

  it('should load no demo data in production mode', () => {
    const run = spawnSync(
      process.execPath,
      ['--import', 'tsx', path.join(REPO_ROOT, 'scripts', 'db.ts'), 'seed'],
      {
        env: { ...process.env, ...base, CW_MODE: 'production' },
        encoding: 'utf8',
        timeout: 50_000,
      },
    );
    expect(run.status).toBe(1);
    expect(run.stderr).toContain('production mode loads no demo data');
  });
});

describe('cookies and proxies in production', () => {
  let ctx: TestContext;
  const extra: Services[] = [];
  beforeAll(async () => {
    ctx = await createTestContext({
      mode: 'production',
      cookieSecure: true,
      trustProxyAddresses: 'loopback',
    });
    await createUser(ctx.services.orm.em.fork(), 'prod@mode.test');
  });
  afterAll(async () => {
    for (const s of extra) await s.close();
    await ctx.close();
  });

  /** Cookies as a browser would send them back (superagent keeps Secure ones for https only). */
  const cookiesOf = (res: request.Response) =>
    ([] as string[])
      .concat(res.headers['set-cookie'] ?? [])
      .map((c) => c.split(';')[0])
      .join('; ');

  async function proxyApp(overrides: Parameters<typeof testConfig>[1]) {
    const services = await initServices(
      testConfig(ctx.schema, { mode: 'production', ...overrides }),
    );
    extra.push(services);
    return createApp(services);
  }

  it('should send a Secure, HttpOnly session cookie when the trusted proxy says HTTPS', async () => {
    const https = { 'x-forwarded-proto': 'https' };
    const csrf = await request(ctx.app).get('/api/auth/csrf').set(https);
    const res = await request(ctx.app)
      .post('/api/auth/login')
      .set(https)
      .set('cookie', cookiesOf(csrf))
      .set('x-csrf-token', csrf.body.token)
      .send({ email: 'prod@mode.test', password: PASSWORD });
    expect(res.status).toBe(200);
    const cookie = String(res.headers['set-cookie']);
    expect(cookie).toMatch(/cw_session=[^;]+;.*Secure/);
    expect(cookie).toContain('HttpOnly');
  });

  it('should set no session cookie when an untrusted hop claims HTTPS', async () => {
    const app = await proxyApp({ cookieSecure: true, trustProxyAddresses: '192.0.2.10' });
    const https = { 'x-forwarded-proto': 'https' };
    // A signed-out visitor's CSRF token is a cookie of its own, not a session.
    const csrf = await request(app).get('/api/auth/csrf').set(https);
    expect(csrf.status).toBe(200);
    expect(cookiesOf(csrf)).not.toContain('cw_session=');
    // Signing in through the untrusted hop: the request is not HTTPS, so no Secure session
    // cookie may be sent over it.
    const res = await request(app)
      .post('/api/auth/login')
      .set(https)
      .set('cookie', cookiesOf(csrf))
      .set('x-csrf-token', csrf.body.token)
      .send({ email: 'prod@mode.test', password: PASSWORD });
    expect(res.status).toBe(200);
    expect(cookiesOf(res)).not.toContain('cw_session=');
  });

  it('should not let a forged client address buy fresh sign-in attempts', async () => {
    const app = await proxyApp({
      cookieSecure: false,
      trustProxyAddresses: '192.0.2.10',
      signInLimit: { windowMs: 60_000, limit: 2 },
    });
    const statuses: number[] = [];
    for (const ip of ['198.51.100.1', '198.51.100.2', '198.51.100.3']) {
      const agent = request.agent(app);
      const csrf = await agent.get('/api/auth/csrf');
      const r = await agent
        .post('/api/auth/login')
        .set('x-forwarded-for', ip)
        .set('x-csrf-token', csrf.body.token)
        .send({ email: 'prod@mode.test', password: 'wrong-password-here' });
      statuses.push(r.status);
    }
    expect(statuses).toEqual([401, 401, 429]);
  });
});
