/**
 * The analysis answer on the wire: the sweep in columns with only the traces asked for,
 * compressed, never cached; the two-metre example at 2,001 points stays under 100 KB.
 */
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { brotliDecompressSync, gunzipSync } from 'node:zlib';
import request from 'supertest';
import { listenHttp } from '../../server/common/http-server';
import { analyzeChain } from '../../shared/engine';
import type { ChainDocument } from '../../shared/schema/chain';
import { analysisFromDto, SWEEP_DIGITS } from '../../shared/schema/sweep-columns';
import { createUser, createWorkspace, PASSWORD, send, signIn, type Client } from './support/agents';
import { exampleChain } from './support/chain-fixture';
import { createTestContext, type TestContext } from './support/test-db';

let ctx: TestContext;
let client: Client;
let server: http.Server;
let cookie: string;
let csrf: string;
let wid: string;

const twoMetre: ChainDocument = exampleChain('two-metre-coupled-preselector');

beforeAll(async () => {
  ctx = await createTestContext();
  const em = ctx.services.orm.em.fork();
  const user = await createUser(em, 'wire@analysis.test');
  wid = (await createWorkspace(em, 'Wire', [[user, 'editor']])).id;
  client = await signIn(ctx.app, 'wire@analysis.test');
  // A raw session for the byte count (supertest undoes the compression it is checking).
  const csrfRes = await request(ctx.app).get('/api/auth/csrf');
  const login = await request(ctx.app)
    .post('/api/auth/login')
    .set('Cookie', csrfRes.headers['set-cookie'])
    .set('x-csrf-token', csrfRes.body.token)
    .send({ email: 'wire@analysis.test', password: PASSWORD });
  cookie = String(login.headers['set-cookie']).split(';')[0];
  csrf = login.body.csrfToken;
  // Served as server/main.ts serves it.
  server = await listenHttp(ctx.app, 0, '127.0.0.1');
});
afterAll(async () => {
  await new Promise((resolve) => server.close(resolve));
  await ctx.close();
});

/** POSTs `body` and returns the raw answer: bytes on the wire and headers. */
function rawPost(
  url: string,
  body: unknown,
  acceptEncoding = 'gzip',
): Promise<{ raw: Buffer; headers: http.IncomingHttpHeaders }> {
  const { port } = server.address() as AddressInfo;
  const payload = JSON.stringify(body);
  return new Promise((resolve, reject) => {
    const req = http.request(
      {
        host: '127.0.0.1',
        port,
        path: url,
        method: 'POST',
        headers: {
          'content-type': 'application/json',
          'content-length': Buffer.byteLength(payload),
          'accept-encoding': acceptEncoding,
          cookie,
          'x-csrf-token': csrf,
        },
      },
      (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => resolve({ raw: Buffer.concat(chunks), headers: res.headers }));
      },
    );
    req.on('error', reject);
    req.end(payload);
  });
}

describe('the analysis answer on the wire', () => {
  it('should send the two-metre example at 2,001 points in at most 100 KB, gzipped, not cached', async () => {
    expect(twoMetre.settings.sweep.points).toBe(2001);
    const { raw, headers } = await rawPost('/api/analysis', { document: twoMetre });
    expect(headers['content-encoding']).toBe('gzip');
    expect(headers['cache-control']).toBe('no-store');
    expect(raw.length).toBeLessThanOrEqual(100 * 1024);
    const body = JSON.parse(gunzipSync(raw).toString('utf8'));
    // The plotted traces only: step-up at every node, input impedance, return loss.
    expect(body.sweep.phaseDeg).toBeUndefined();
    expect(body.sweep.stepUpDb).toHaveLength(body.nodes.length);
    expect(body.sweep.zInRe).toHaveLength(2001);
  });

  it('should send brotli when the client prefers it, and plain JSON when it accepts no encoding', async () => {
    const br = await rawPost('/api/analysis', { document: twoMetre }, 'br, gzip');
    expect(br.headers['content-encoding']).toBe('br');
    expect(br.headers.vary).toMatch(/Accept-Encoding/i);
    expect(br.raw.length).toBeLessThanOrEqual(100 * 1024);
    const fromBr = JSON.parse(brotliDecompressSync(br.raw).toString('utf8'));
    expect(fromBr.sweep.zInRe).toHaveLength(2001);

    const plain = await rawPost('/api/analysis', { document: twoMetre }, 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    // The same answer whichever way it travelled.
    expect(JSON.parse(plain.raw.toString('utf8'))).toEqual(fromBr);
  });

  it('should carry the engine sweep to the stated significant digits', async () => {
    const res = await send(client, 'post', '/api/analysis', {
      document: twoMetre,
      traces: ['stepUp', 'phase', 'zIn', 'returnLoss'],
    });
    expect(res.status).toBe(200);
    const sweep = analysisFromDto(res.body).sweep!;
    const engine = analyzeChain(twoMetre, { sweep: true }).sweep!;
    const tol = 0.5 * 10 ** (1 - SWEEP_DIGITS);
    const near = (got: number[], want: number[]) => {
      expect(got).toHaveLength(want.length);
      const worst = Math.max(...want.map((w, i) => Math.abs(got[i] - w) / Math.abs(w || 1)));
      expect(worst).toBeLessThanOrEqual(tol);
    };
    near(sweep.freqsHz, engine.freqsHz);
    near(sweep.zIn.re, engine.zIn.re);
    near(sweep.zIn.im, engine.zIn.im);
    near(sweep.returnLossDb, engine.returnLossDb);
    engine.nodes.forEach((n, i) => {
      expect(sweep.nodes[i].index).toBe(n.index);
      near(sweep.nodes[i].stepUpDb, n.stepUpDb);
      near(sweep.nodes[i].phaseDeg, n.phaseDeg);
    });
  });

  it('should send the differences packing in about a third of the bytes, read back to the same values', async () => {
    const traces = ['stepUp', 'phase', 'zIn', 'returnLoss'];
    const plain = await rawPost('/api/analysis', { document: twoMetre, traces }, 'br');
    const packed = await rawPost(
      '/api/analysis',
      { document: twoMetre, traces, sweepPacking: 'differences' },
      'br',
    );
    expect(packed.headers['content-encoding']).toBe('br');
    expect(packed.raw.length).toBeLessThan(plain.raw.length / 2.5);
    const fromPlain = JSON.parse(brotliDecompressSync(plain.raw).toString('utf8'));
    const fromPacked = JSON.parse(brotliDecompressSync(packed.raw).toString('utf8'));
    expect(fromPacked.sweep.packing).toBe('differences');
    expect(fromPacked.sweep.zInRe).toEqual({ decimals: expect.any(Number), steps: expect.any(Array) }); // prettier-ignore
    // Every value identical to the plain packing's (toEqual compares the doubles exactly).
    expect(analysisFromDto(fromPacked)).toEqual(analysisFromDto(fromPlain));
    expect(analysisFromDto(fromPacked).sweep!.zIn.re).toHaveLength(2001);
  });

  it('should send a stored chain packed as differences when asked, and refuse an unknown packing', async () => {
    const created = await send(client, 'post', `/api/workspaces/${wid}/chains`, {
      document: twoMetre,
    });
    expect(created.status).toBe(201);
    const url = `/api/chains/${created.body.id}/analysis?sweep=1`;
    const plain = await send(client, 'get', url);
    const packed = await send(client, 'get', `${url}&packing=differences`);
    expect(packed.status).toBe(200);
    expect(packed.body.sweep.packing).toBe('differences');
    expect(plain.body.sweep.packing).toBeUndefined();
    expect(analysisFromDto(packed.body)).toEqual(analysisFromDto(plain.body));
    const wrong = await send(client, 'get', `${url}&packing=zip`);
    expect(wrong.status).toBe(422);
    expect(wrong.body.message).toContain('plain, differences');
    const wrongBody = await send(client, 'post', '/api/analysis', {
      document: twoMetre,
      sweepPacking: 'zip',
    });
    expect(wrongBody.status).toBe(422);
  });

  it('should send only the traces and nodes asked for', async () => {
    const res = await send(client, 'post', '/api/analysis', {
      document: twoMetre,
      traces: ['returnLoss', 'stepUp'],
      nodes: [0, 2],
    });
    expect(res.status).toBe(200);
    expect(Object.keys(res.body.sweep).sort()).toEqual(
      ['digits', 'freqsHz', 'nodes', 'returnLossDb', 'stepUpDb'].sort(),
    );
    expect(res.body.sweep.nodes).toEqual([0, 2]);
    expect(res.body.sweep.stepUpDb).toHaveLength(2);
  });

  it('should refuse an unknown trace with 422 naming the choices', async () => {
    const res = await send(client, 'post', '/api/analysis', {
      document: twoMetre,
      traces: ['gain'],
    });
    expect(res.status).toBe(422);
    expect(res.body.message).toContain('stepUp, phase, zIn, returnLoss');
  });
});
