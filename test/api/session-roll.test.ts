/**
 * A session rolls forward without a database write on every request: its row is written
 * when it changes, and when a day has passed since it last rolled.
 */
import pg from 'pg';
import { SESSION_MS, SESSION_ROLL_MS } from '../../server/auth/session';
import { forgetCachedSessions } from '../../server/auth/session-cache';
import { SESSION_TABLE } from '../../server/mikro-orm.config';
import { createUser, signIn, type Client } from './support/agents';
import { createTestContext, testDatabaseUrl, type TestContext } from './support/test-db';

let ctx: TestContext;
let db: pg.Client;
let client: Client;

beforeAll(async () => {
  ctx = await createTestContext();
  await createUser(ctx.services.orm.em.fork(), 'roller@session.test');
  client = await signIn(ctx.app, 'roller@session.test');
  db = new pg.Client({ connectionString: testDatabaseUrl() });
  await db.connect();
});
afterAll(async () => {
  await db.end();
  await ctx.close();
});

const table = () => `"${ctx.schema}"."${SESSION_TABLE}"`;

/** The signed-in session's row: its expiry and the cookie expiry stored in it, ms. */
async function row(): Promise<{ sid: string; expire: number; cookieExpires: number }> {
  const { rows } = await db.query(
    `select sid, expire, sess from ${table()} where sess::text like '%"passport"%'`,
  );
  expect(rows).toHaveLength(1);
  return {
    sid: rows[0].sid,
    expire: new Date(rows[0].expire).getTime(),
    cookieExpires: new Date(rows[0].sess.cookie.expires).getTime(),
  };
}

describe('session roll', () => {
  it('should not write the session row on requests that change nothing', async () => {
    const before = await row();
    for (let i = 0; i < 3; i++) {
      const res = await client.agent.get('/api/me');
      expect(res.status).toBe(200);
      expect(res.headers['set-cookie']).toBeUndefined();
    }
    expect(await row()).toEqual(before);
  });

  it('should roll cookie and row forward once a day has passed since the last roll', async () => {
    const { sid } = await row();
    // Age the session by a day and a minute, as if it was last rolled then.
    const shift = SESSION_ROLL_MS + 60_000;
    await db.query(
      `update ${table()} set expire = expire - $2 * interval '1 millisecond',
         sess = jsonb_set(sess::jsonb, '{cookie,expires}',
           to_jsonb(to_char(((sess->'cookie'->>'expires')::timestamptz - $2 * interval '1 millisecond')
             at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')))::json
       where sid = $1`,
      [sid, shift],
    );
    // As everything that changes session rows in SQL does: the server's cached read goes.
    forgetCachedSessions();
    const aged = await row();
    const res = await client.agent.get('/api/me');
    expect(res.status).toBe(200);
    expect(String(res.headers['set-cookie'])).toContain('cw_session=');
    const rolled = await row();
    // Now about 14 days ahead again: more than the aged expiry, within a minute of now + 14 d.
    expect(rolled.expire).toBeGreaterThan(aged.expire + SESSION_ROLL_MS);
    expect(Math.abs(rolled.cookieExpires - (Date.now() + SESSION_MS))).toBeLessThan(60_000);
    // And quiet again afterwards.
    const again = await client.agent.get('/api/me');
    expect(again.headers['set-cookie']).toBeUndefined();
    expect(await row()).toEqual(rolled);
  });
});
