import http, { type IncomingMessage, type Server } from 'node:http';
import { Socket, type AddressInfo } from 'node:net';
import express from 'express';
import { appMessageClasses, listenHttp } from './http-server';

function tinyApp() {
  const app = express();
  app.get('/echo', (req, res) => {
    res.set('x-seen', String(req.get('x-probe')));
    res.status(201).json({ q: req.query.q, path: req.path });
  });
  return app;
}

function get(server: Server, path: string, headers: Record<string, string> = {}) {
  const { port } = server.address() as AddressInfo;
  return new Promise<{ status: number; headers: http.IncomingHttpHeaders; body: string }>(
    (resolve, reject) => {
      http
        .get({ host: '127.0.0.1', port, path, headers }, (res) => {
          let body = '';
          res.on('data', (c: Buffer) => (body += c.toString()));
          res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body }));
        })
        .on('error', reject);
    },
  );
}

describe('the HTTP server for the app', () => {
  let server: Server;
  const app = tinyApp();
  const seen: { req: boolean; res: boolean }[] = [];

  beforeAll(async () => {
    server = await listenHttp(app, 0, '127.0.0.1');
    // Runs before the app: what the server made, before Express touched it.
    server.prependListener('request', (req: IncomingMessage, res: http.ServerResponse) => {
      seen.push({
        req: Object.getPrototypeOf(req) === app.request,
        res: Object.getPrototypeOf(res) === app.response,
      });
    });
  });
  afterAll(() => new Promise((resolve) => server.close(resolve)));

  it("makes each request and answer with the app's prototypes from the start", async () => {
    await get(server, '/echo?q=1');
    await get(server, '/echo?q=2');
    expect(seen).toEqual([
      { req: true, res: true },
      { req: true, res: true },
    ]);
  });

  it('serves Express as before: helpers, status, headers, query, the 404 of no route', async () => {
    const ok = await get(server, '/echo?q=tank', { 'x-probe': 'loaded-q' });
    expect(ok.status).toBe(201);
    expect(ok.headers['x-seen']).toBe('loaded-q');
    expect(ok.headers['content-type']).toMatch(/^application\/json/);
    expect(JSON.parse(ok.body)).toEqual({ q: 'tank', path: '/echo' });
    expect((await get(server, '/nowhere')).status).toBe(404);
  });

  it("makes messages that are Node's own, streams included", () => {
    const classes = appMessageClasses(app);
    expect(classes).toBeDefined();
    const req = new classes!.IncomingMessage(new Socket());
    expect(req).toBeInstanceOf(http.IncomingMessage);
    expect(typeof req.on).toBe('function');
    expect(req.headers).toEqual({});
    const res = new classes!.ServerResponse(req);
    expect(res).toBeInstanceOf(http.ServerResponse);
    expect(res.statusCode).toBe(200);
  });

  it('refuses a port already taken, with the reason', async () => {
    const { port } = server.address() as AddressInfo;
    await expect(listenHttp(tinyApp(), port, '127.0.0.1')).rejects.toThrow(/EADDRINUSE/);
  });
});
