/**
 * The failed-sign-in limit is kept in PostgreSQL: it holds across server processes (two
 * apps on the same database) and across a restart (a new app after the old one closed).
 */
import type { Express } from 'express';
import { createApp } from '../../server/app';
import { initServices, type Services } from '../../server/common/services';
import { anonymous, createUser, send } from './support/agents';
import { createTestContext, testConfig, type TestContext } from './support/test-db';

const LIMIT = 3;
let ctx: TestContext;
const extra: Services[] = [];

/** Another server process on the same database (its own pools, its own limiter). */
async function anotherProcess(): Promise<Express> {
  const services = await initServices(
    testConfig(ctx.schema, { signInLimit: { windowMs: 60_000, limit: LIMIT } }),
  );
  extra.push(services);
  return createApp(services);
}

async function failSignIn(app: Express) {
  const client = await anonymous(app);
  return send(client, 'post', '/api/auth/login', {
    email: 'limited@limit.test',
    password: 'not-the-password',
  });
}

beforeAll(async () => {
  ctx = await createTestContext({ signInLimit: { windowMs: 60_000, limit: LIMIT } });
  await createUser(ctx.services.orm.em.fork(), 'limited@limit.test');
});
afterAll(async () => {
  for (const s of extra) await s.close();
  await ctx.close();
});

describe('sign-in limit', () => {
  it('should count failures from every process against one limit, and keep them over a restart', async () => {
    const first = await anotherProcess();
    const second = await anotherProcess();
    // Two failures on one process, one on the other: the limit of 3 is used up.
    expect((await failSignIn(first)).status).toBe(401);
    expect((await failSignIn(second)).status).toBe(401);
    expect((await failSignIn(first)).status).toBe(401);
    const refused = await failSignIn(second);
    expect(refused.status).toBe(429);
    expect(refused.body.error).toBe('too-many-attempts');

    // "Restart": both processes stop, a fresh one starts; the count is still there.
    await extra.splice(0).reduce((p, s) => p.then(() => s.close()), Promise.resolve());
    const restarted = await anotherProcess();
    expect((await failSignIn(restarted)).status).toBe(429);
  });

  it('should start a counter afresh once its window has ended', async () => {
    const app = await anotherProcess();
    const rows = await ctx.services.orm.em
      .getConnection()
      .execute(
        `update "${ctx.schema}".rate_limit_hit set reset_at = now() - interval '1 second' returning key`,
      );
    expect(rows.length).toBe(1);
    expect((await failSignIn(app)).status).toBe(401);
  });
});
