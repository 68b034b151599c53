/**
 * The database goes away for 5 s under traffic: every request it cannot serve is answered
 * 503 with Retry-After (never a 500), the server recovers by itself when the database is
 * back, and every save it acknowledged is stored. The test runs a PostgreSQL cluster of its
 * own (scripts/pg-cluster.sh), so stopping it touches no other test's database.
 */
import { spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { createServer } from 'node:net';
import path from 'node:path';
import { MikroORM } from '@mikro-orm/postgresql';
import pg from 'pg';
import request from 'supertest';
import { chainDocumentSchema } from '../../shared/schema/chain';
import { createApp } from '../../server/app';
import { createChain } from '../../server/chains/chain-store';
import { ChainRevisionSchema } from '../../server/chains/revision.entity';
import { ChainSchema } from '../../server/chains/chain.entity';
import { initServices, type Services } from '../../server/common/services';
import { REPO_ROOT } from '../../server/config';
import { ormOptions } from '../../server/mikro-orm.config';
import { createUser, createWorkspace, PASSWORD } from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { testConfig } from './support/test-db';

jest.setTimeout(180_000);

const cluster = `pg-outage-${randomBytes(3).toString('hex')}`;
const OUTAGE_MS = 5000;

function clusterScript(...args: string[]): string {
  const run = spawnSync('bash', [path.join(REPO_ROOT, 'scripts', 'pg-cluster.sh'), ...args], {
    encoding: 'utf8',
    timeout: 120_000,
  });
  if (run.status !== 0) throw new Error(`pg-cluster.sh ${args.join(' ')}: ${run.stderr}`);
  return run.stdout;
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.on('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as { port: number };
      srv.close(() => resolve(port));
    });
  });
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

let port = 0;
let dbUrl = '';
let services: Services | undefined;
const logLines: string[] = [];

beforeAll(async () => {
  port = await freePort();
  const out = clusterScript('start', cluster, String(port));
  const superUrl = /CW_PG_URL=(\S+)/.exec(out)![1];
  const admin = new pg.Client({ connectionString: superUrl });
  await admin.connect();
  await admin.query('create database outage');
  await admin.end();
  dbUrl = superUrl.replace(/\/postgres$/, '/outage');
  const orm = await MikroORM.init(ormOptions(dbUrl));
  await orm.migrator.up();
  await orm.close(true);
});

afterAll(async () => {
  await services?.close();
  clusterScript('remove', cluster);
});

interface Answer {
  status: number;
  retryAfter?: string;
}

describe('database outage', () => {
  it('should answer 503 with Retry-After while the database is away, then recover and lose no save', async () => {
    services = await initServices(
      testConfig('public', {
        databaseUrl: dbUrl,
        dbSchema: undefined,
        // The outage logs a warning per refused request: keep them here, not on the console.
        log: { level: 'warn', destination: { write: (line: string) => logLines.push(line) } },
      }),
    );
    const em = services.orm.em.fork();
    const user = await createUser(em, 'operator@outage.test');
    const ws = await createWorkspace(em, 'Outage bench', [[user, 'editor']]);
    const chain = await createChain(em, {
      workspace: ws,
      document: chainDocumentSchema.parse(fixtureChain({ name: 'Kept through the outage' })),
      user,
      message: 'created',
    });
    const app = createApp(services);
    const agent = request.agent(app);
    const csrf = (await agent.get('/api/auth/csrf')).body.token;
    const login = await agent
      .post('/api/auth/login')
      .set('x-csrf-token', csrf)
      .send({ email: 'operator@outage.test', password: PASSWORD });
    expect(login.status).toBe(200);
    const token = login.body.csrfToken;

    const answers: Answer[] = [];
    const acknowledged: { version: number; message: string }[] = [];
    const record = (res: request.Response) =>
      answers.push({ status: res.status, retryAfter: res.headers['retry-after'] });
    let running = true;
    let recoveredStreak = 0;
    let restarted = false;

    const reader = async () => {
      while (running) {
        const res = await agent.get(`/api/chains/${chain.id}`);
        record(res);
        if (restarted) recoveredStreak = res.status === 200 ? recoveredStreak + 1 : 0;
        await sleep(20);
      }
    };
    const saver = async () => {
      let version: number | null = 1;
      let n = 0;
      while (running) {
        if (version === null) {
          // After a refusal the save may or may not have landed: read the version again.
          const res = await agent.get(`/api/chains/${chain.id}`);
          record(res);
          if (res.status === 200) version = res.body.version;
          await sleep(50);
          continue;
        }
        const message = `save ${++n}`;
        const res = await agent
          .put(`/api/chains/${chain.id}`)
          .set('x-csrf-token', token)
          .send({
            version,
            message,
            document: fixtureChain({ name: 'Kept through the outage', description: message }),
          });
        record(res);
        if (res.status === 200) {
          acknowledged.push({ version: res.body.version, message });
          version = res.body.version;
        } else {
          version = null;
        }
        await sleep(30);
      }
    };

    const traffic = Promise.all([reader(), reader(), saver()]);
    await sleep(1500);
    clusterScript('stop', cluster);
    const stoppedAt = answers.length;
    await sleep(OUTAGE_MS);
    const duringOutage = answers.slice(stoppedAt);
    clusterScript('start', cluster, String(port));
    restarted = true;
    const deadline = Date.now() + 60_000;
    while (recoveredStreak < 20 && Date.now() < deadline) await sleep(100);
    running = false;
    await traffic;

    // Only successes and 503s, each 503 telling when to come back.
    const statuses = [...new Set(answers.map((a) => a.status))].sort();
    // A failure names the errors the server logged as failures, so a stray 500 says why.
    const failures = logLines.filter((line) => line.includes('request failed'));
    expect({ statuses, failures }).toEqual({ statuses: [200, 503], failures: [] });
    expect(answers.filter((a) => a.status === 503 && a.retryAfter !== '5')).toEqual([]);
    // The outage was real and the requests during it were refused, not hung.
    expect(duringOutage.filter((a) => a.status === 503).length).toBeGreaterThan(10);
    expect(recoveredStreak).toBeGreaterThanOrEqual(20);
    expect((await agent.get('/api/health')).status).toBe(200);

    // Nothing lost: every acknowledged save is a revision with its message at its version.
    const check = services.orm.em.fork();
    const stored = await check.findOneOrFail(ChainSchema, chain.id);
    const revisions = await check.find(ChainRevisionSchema, { chain: chain.id });
    const byVersion = new Map(revisions.map((r) => [r.version, r.message]));
    expect(acknowledged.length).toBeGreaterThan(5);
    expect(acknowledged.filter((a) => byVersion.get(a.version) !== a.message)).toEqual([]);
    expect(revisions.length).toBe(stored.version);
    // Warnings went to the log, with no driver connection string in them.
    expect(logLines.join('\n')).toContain('database unavailable');
    expect(logLines.join('\n')).not.toContain(dbUrl);
  });
});
