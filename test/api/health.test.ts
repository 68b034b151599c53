/** GET /api/health tells whether the database answers, and nothing more to anonymous callers. */
import request from 'supertest';
import { createApp } from '../../server/app';
import { initServices } from '../../server/common/services';
import { createTestContext, testConfig, type TestContext } from './support/test-db';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
});
afterAll(() => ctx.close());

describe('health', () => {
  it('should answer 200 when the database answers', async () => {
    const res = await request(ctx.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok', db: 'ok' });
  });

  it('should answer 503 with Retry-After, and keep the driver error in the log', async () => {
    const logged: string[] = [];
    // Port 9 (discard) on loopback: nothing listens, so every connection is refused.
    const services = await initServices(
      testConfig('public', {
        databaseUrl: 'postgresql://postgres:x@127.0.0.1:9/nothing',
        log: { level: 'warn', destination: { write: (line: string) => logged.push(line) } },
      }),
      { connect: false },
    );
    try {
      const res = await request(createApp(services)).get('/api/health');
      expect(res.status).toBe(503);
      expect(res.headers['retry-after']).toBe('5');
      expect(res.body).toMatchObject({ status: 'degraded', db: 'unreachable' });
      expect(JSON.stringify(res.body)).not.toMatch(/ECONNREFUSED|127\.0\.0\.1|:9\b/);
      expect(logged.join('\n')).toMatch(/ECONNREFUSED|connect/);
    } finally {
      await services.close();
    }
  });
});
