/**
 * Presence and live events across two server processes: this test's app, and a real
 * second process (server/main.ts) on the same database, as two processes behind a balancer
 * would be. Events travel between them only through PostgreSQL LISTEN/NOTIFY.
 */
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { PresenceSchema } from '../../server/presence/presence.entity';
import { createUser, createWorkspace, send, signIn, type Client } from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { startServerProcess, type ServerProcess } from './support/server-process';
import { createTestContext, type TestContext } from './support/test-db';

// A second server process starts (TypeScript compiled on the fly): give it time.
jest.setTimeout(120_000);

/** One server-sent event as the test reads it. */
interface StreamEvent {
  event: string;
  data: { users?: { displayName: string }[]; [key: string]: unknown };
}

interface Stream {
  events: StreamEvent[];
  /** Resolves with the first event (already received or coming) that passes `test`. */
  next(test: (e: StreamEvent) => boolean): Promise<StreamEvent>;
  close(): void;
}

/** Opens GET /api/chains/:id/events with a client's cookie and parses the event stream. */
function openStream(port: number, client: Client, chainId: string): Promise<Stream> {
  const cookie = (
    client.agent as unknown as { jar: { getCookies(o: object): { toValueString(): string }[] } }
  ).jar
    .getCookies({ domain: '127.0.0.1', path: '/api', secure: false, script: false })
    .map((c) => c.toValueString())
    .join('; ');
  return new Promise((resolve, reject) => {
    const events: StreamEvent[] = [];
    const waiters: {
      test: (e: StreamEvent) => boolean;
      done: (e: StreamEvent) => void;
    }[] = [];
    const req = http.get(
      { host: '127.0.0.1', port, path: `/api/chains/${chainId}/events`, headers: { cookie } },
      (res) => {
        if (res.statusCode !== 200) return reject(new Error(`stream answered ${res.statusCode}`));
        let buffer = '';
        res.setEncoding('utf8');
        res.on('data', (chunk: string) => {
          buffer += chunk;
          let cut;
          while ((cut = buffer.indexOf('\n\n')) >= 0) {
            const block = buffer.slice(0, cut);
            buffer = buffer.slice(cut + 2);
            const event = /^event: (.+)$/m.exec(block)?.[1];
            const data = /^data: (.+)$/m.exec(block)?.[1];
            if (!event || !data) continue;
            const e = { event, data: JSON.parse(data) };
            events.push(e);
            for (const w of [...waiters]) {
              if (w.test(e)) {
                waiters.splice(waiters.indexOf(w), 1);
                w.done(e);
              }
            }
          }
        });
        resolve({
          events,
          next: (test) =>
            new Promise((done) => {
              const seen = events.find(test);
              if (seen) done(seen);
              else waiters.push({ test, done });
            }),
          close: () => req.destroy(),
        });
      },
    );
    req.on('error', (err) => {
      if ((err as NodeJS.ErrnoException).code !== 'ECONNRESET') reject(err);
    });
  });
}

let ctx: TestContext;
let serverA: http.Server;
let processB: ServerProcess;
let ana: Client;
let ben: Client;
let chainId: string;

beforeAll(async () => {
  ctx = await createTestContext();
  // The second process: its own pools and LISTEN connection on the same schema.
  processB = await startServerProcess(ctx.schema);
  serverA = ctx.app.listen(0, '127.0.0.1');
  const em = ctx.services.orm.em.fork();
  const a = await createUser(em, 'ana@live.test', { displayName: 'Ana' });
  const b = await createUser(em, 'ben@live.test', { displayName: 'Ben' });
  const wid = (
    await createWorkspace(em, 'Live', [
      [a, 'editor'],
      [b, 'editor'],
    ])
  ).id;
  ana = await signIn(serverA as unknown as never, 'ana@live.test');
  ben = await signIn(processB.url as unknown as never, 'ben@live.test');
  chainId = (await send(ana, 'post', `/api/workspaces/${wid}/chains`, { document: fixtureChain() }))
    .body.id;
});
afterAll(async () => {
  serverA.close();
  await processB.stop();
  await ctx.close();
});

const names = (e: StreamEvent) => e.data.users!.map((u: { displayName: string }) => u.displayName);

describe('presence and live events across processes', () => {
  it('should show who is here, tell of a save and of comments, and of leaving', async () => {
    const portA = (serverA.address() as AddressInfo).port;
    const a = await openStream(portA, ana, chainId);
    await a.next((e) => e.event === 'presence' && names(e).join() === 'Ana');
    const b = await openStream(processB.port, ben, chainId);
    // Ana's stream (this process) hears that Ben (the other process) arrived.
    await a.next((e) => e.event === 'presence' && names(e).join() === 'Ana,Ben');
    await b.next((e) => e.event === 'presence' && names(e).join() === 'Ana,Ben');

    const current = await send(ben, 'get', `/api/chains/${chainId}`);
    await send(ben, 'put', `/api/chains/${chainId}`, {
      version: current.body.version,
      document: fixtureChain({ description: 'Ben was here' }),
    }).expect(200);
    const saved = await a.next((e) => e.event === 'saved');
    expect(saved.data).toEqual({ chainId, version: 2, by: 'Ben', byUserId: expect.any(String) });

    await send(ben, 'post', `/api/chains/${chainId}/comments`, { body: 'Look at the tank' }).expect(
      201,
    );
    const comments = await a.next((e) => e.event === 'comments');
    expect(comments.data).toEqual({ chainId, by: 'Ben' });

    b.close();
    await a.next((e) => e.event === 'presence' && names(e).join() === 'Ana');
    a.close();
    // The stream's row goes when it closes (so nobody is shown after leaving).
    const em = ctx.services.orm.em.fork();
    for (let i = 0; i < 100 && (await em.count(PresenceSchema, { chain: chainId })) > 0; i++) {
      await new Promise((r) => setTimeout(r, 50));
    }
    expect(await em.count(PresenceSchema, { chain: chainId })).toBe(0);
  });
});
