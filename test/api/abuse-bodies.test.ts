/**
 * Hostile JSON shapes are refused by the body parser with a 400 that says what to fix, on
 * any path and before sign-in or the CSRF check, and nothing is logged as a failure (the
 * console guard in support/fail-on-console.ts fails the test on any error line).
 */
import request from 'supertest';
import { MAX_JSON_ARRAY_LENGTH, MAX_JSON_DEPTH } from '../../server/common/json-body';
import { createUser, send, signIn } from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { createTestContext, type TestContext } from './support/test-db';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
  await createUser(ctx.services.orm.em.fork(), 'abuse@bodies.test');
});
afterAll(() => ctx.close());

const nestedArrays = (depth: number) => '['.repeat(depth) + ']'.repeat(depth);
const nestedObjects = (depth: number) => '{"a":'.repeat(depth) + '1' + '}'.repeat(depth);

describe('hostile JSON bodies', () => {
  it.each([
    ['/api/auth/login', 'post'],
    ['/api/analysis', 'post'],
    ['/api/chains/00000000-0000-4000-8000-000000000000', 'put'],
    ['/api/no-such-route', 'post'],
  ] as const)('should refuse 10,000 nested arrays on %s with a 400', async (url, method) => {
    const agent = request(ctx.app);
    const res = await agent[method](url)
      .set('content-type', 'application/json')
      .send(nestedArrays(10_000));
    expect(res.status).toBe(400);
    expect(res.body).toEqual({
      error: 'body-shape',
      message: expect.stringContaining(`more than ${MAX_JSON_DEPTH} levels deep`),
    });
  });

  it('should refuse deeply nested objects, even inside strings-heavy bodies', async () => {
    const body = `{"note":"[[[[ { not structure","x":${nestedObjects(MAX_JSON_DEPTH + 1)}}`;
    const res = await request(ctx.app)
      .post('/api/auth/login')
      .set('content-type', 'application/json')
      .send(body);
    expect(res.status).toBe(400);
    expect(res.body.error).toBe('body-shape');
  });

  it('should accept nesting up to the limit (then judge the body by its schema)', async () => {
    const res = await request(ctx.app)
      .post('/api/auth/login')
      .set('content-type', 'application/json')
      .send(nestedArrays(MAX_JSON_DEPTH));
    // Past the parser: the CSRF check answers, not the shape check.
    expect(res.status).toBe(403);
  });

  it('should refuse an array longer than the limit', async () => {
    const long = `[${new Array(MAX_JSON_ARRAY_LENGTH + 1).fill('0').join(',')}]`;
    const res = await request(ctx.app)
      .post('/api/analysis')
      .set('content-type', 'application/json')
      .send(`{"document":{"stages":${long}}}`);
    expect(res.status).toBe(400);
    expect(res.body.message).toContain(`more than ${MAX_JSON_ARRAY_LENGTH} elements`);
  });

  it('should not count brackets and commas inside strings', async () => {
    const client = await signIn(ctx.app, 'abuse@bodies.test');
    const doc = fixtureChain({ description: `${'[{,'.repeat(1_600)} "quoted \\" [` });
    const res = await send(client, 'post', '/api/analysis', {
      document: doc,
      sweep: false,
      // Keys the schema does not know are dropped; this one only has to pass the parser.
      note: ','.repeat(MAX_JSON_ARRAY_LENGTH * 2),
    });
    expect(res.status).toBe(200);
  }, 30_000);
});
