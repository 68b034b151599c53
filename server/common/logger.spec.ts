import type { EventEmitter } from 'node:events';
import { closeSync, mkdtempSync, openSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import express from 'express';
import request from 'supertest';
import { batchedOutput, createLogger, flushLogs, requestLogger } from './logger';

describe('the batched log output', () => {
  const dir = mkdtempSync(path.join(tmpdir(), 'cw-log-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('should hold lines until 4 KB gather or a flush, then write them whole and in order', async () => {
    const file = path.join(dir, 'batched.log');
    const fd = openSync(file, 'w');
    const destination = batchedOutput(fd);
    const logger = createLogger({ destination });
    logger.info({ n: 1 }, 'first');
    logger.info({ n: 2 }, 'second');
    // Not written yet: one write per batch, not per line.
    expect(readFileSync(file, 'utf8')).toBe('');
    flushLogs();
    const lines = readFileSync(file, 'utf8')
      .trim()
      .split('\n')
      .map((l) => JSON.parse(l));
    expect(lines.map((l) => [l.msg, l.n])).toEqual([
      ['first', 1],
      ['second', 2],
    ]);
    // More than a batch's worth goes out without a flush.
    const written = new Promise((resolve) => (destination as unknown as EventEmitter).once('write', resolve)); // prettier-ignore
    for (let i = 0; i < 100; i++) logger.info({ i, pad: 'x'.repeat(60) }, 'filler');
    await written;
    expect(readFileSync(file, 'utf8').length).toBeGreaterThan(4096);
    flushLogs();
    // A batch already on its way (an asynchronous write in flight) lands after flushLogs
    // returns: wait for it rather than read a file it has not reached yet.
    const lineCount = () => readFileSync(file, 'utf8').trim().split('\n').length;
    for (let waited = 0; lineCount() < 102 && waited < 5000; waited += 20) {
      await new Promise((resolve) => setTimeout(resolve, 20));
    }
    expect(lineCount()).toBe(102);
    // Ended before its descriptor goes: its timer must not write to a closed (or reused) fd.
    const closed = new Promise((resolve) => (destination as unknown as EventEmitter).once('close', resolve)); // prettier-ignore
    (destination as unknown as { end(): void }).end();
    await closed;
  });

  it('should survive a descriptor closed under it: the lines are lost, not the process', async () => {
    const fd = openSync(path.join(dir, 'closed.log'), 'w');
    const destination = batchedOutput(fd);
    const logger = createLogger({ destination });
    closeSync(fd);
    // Watched without a listener of the test's own: only the logger's keeps the error handled.
    const emit = jest.spyOn(destination as unknown as EventEmitter, 'emit');
    logger.info('lost');
    (destination as unknown as { flush(): void }).flush();
    const end = Date.now() + 5000;
    while (!emit.mock.calls.some(([name]) => name === 'error') && Date.now() < end) {
      await new Promise((resolve) => setTimeout(resolve, 10));
    }
    const error = emit.mock.calls.find(([name]) => name === 'error')?.[1];
    expect(error).toMatchObject({ code: 'EBADF' });
    // Forgotten: a later flush of every log does not try it again.
    expect(() => flushLogs()).not.toThrow();
  });
});

describe('the request line', () => {
  function appWithLog() {
    const lines: Record<string, unknown>[] = [];
    const destination = { write: (line: string) => lines.push(JSON.parse(line)) };
    const logger = createLogger({ destination });
    const app = express();
    app.use(requestLogger(logger));
    app.get('/api/things/:id', (req, res) => {
      req.log.info({ seen: req.params.id }, 'inside');
      res.status(201).json({ id: req.id });
    });
    app.get('/api/broken', () => {
      throw new Error('broken on purpose');
    });
    return { app, lines };
  }

  it('should write one line per request, with the route pattern and the request id it sends back', async () => {
    const { app, lines } = appWithLog();
    const answer = await request(app)
      .get('/api/things/abc?secret=1')
      .set('x-request-id', 'proxy-id.1');
    expect(answer.status).toBe(201);
    expect(answer.headers['x-request-id']).toBe('proxy-id.1');
    expect(answer.body).toEqual({ id: 'proxy-id.1' });
    const [inside, line] = lines;
    expect(inside).toMatchObject({ reqId: 'proxy-id.1', seen: 'abc', msg: 'inside' });
    expect(Object.keys(line)).toEqual(['level', 'time', 'app', 'reqId', 'method', 'route', 'status', 'ms', 'userId', 'msg']); // prettier-ignore
    expect(line).toMatchObject({ level: 30, app: 'chainwright', reqId: 'proxy-id.1', method: 'GET', route: '/api/things/:id', status: 201, userId: null, msg: 'request' }); // prettier-ignore
    expect(line.ms).toEqual(expect.any(Number));
    expect(lines).toHaveLength(2);
  });

  it('should make its own id for a malformed one, and log a failed request once', async () => {
    const { app, lines } = appWithLog();
    const answer = await request(app).get('/api/broken').set('x-request-id', 'bad id with spaces');
    expect(answer.status).toBe(500);
    const id = answer.headers['x-request-id'];
    expect(id).toMatch(/^[0-9a-f-]{36}$/);
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatchObject({
      reqId: id,
      route: '/api/broken',
      status: 500,
      msg: 'request',
    });
  });
});
