/** The receiver plan through the API: asked for in the body or the query, absent otherwise. */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { analyzeChain } from '../../shared/engine';
import { chainDocumentSchema } from '../../shared/schema/chain';
import { createUser, createWorkspace, send, signIn, type Client } from './support/agents';
import { createTestContext, type TestContext } from './support/test-db';

let ctx: TestContext;
let viewer: Client;

const example = () => {
  const file = path.join(__dirname, '..', '..', 'examples', 'shortwave-superhet-single-tank.chain.json'); // prettier-ignore
  const { variantOf: _v, ...raw } = JSON.parse(readFileSync(file, 'utf8'));
  return chainDocumentSchema.parse(raw);
};

beforeAll(async () => {
  ctx = await createTestContext();
  const em = ctx.services.orm.em.fork();
  const v = await createUser(em, 'viewer@plan.test');
  await createWorkspace(em, 'Plan', [[v, 'viewer']]);
  viewer = await signIn(ctx.app, 'viewer@plan.test');
});
afterAll(() => ctx.close());

describe('receiver plan over the API', () => {
  it('answers no plan unless asked', async () => {
    const res = await send(viewer, 'post', '/api/analysis', { document: example(), sweep: false });
    expect(res.status).toBe(200);
    expect(res.body.plan).toBeUndefined();
  });

  it('answers the engine’s plan, with the spur chart only for plan: "full"', async () => {
    const doc = example();
    const expected = analyzeChain(doc, { sweep: false, plan: true }).plan!;
    const res = await send(viewer, 'post', '/api/analysis', { document: doc, sweep: false, plan: true }); // prettier-ignore
    expect(res.status).toBe(200);
    expect(res.body.plan.spurs[0].kind).toBe('image');
    expect(res.body.plan.spurs[0].rejectionDb).toBeCloseTo(expected.spurs[0].rejectionDb!, 9);
    expect(res.body.plan.externalNoise.statement).toBe(expected.externalNoise.statement);
    expect(res.body.plan.spurChart).toBeNull();
    const full = await send(viewer, 'post', '/api/analysis', { document: doc, sweep: false, plan: 'full' }); // prettier-ignore
    expect(full.body.plan.spurChart.dialHz).toHaveLength(41);
    expect(full.body.plan.ifChoice.length).toBeGreaterThan(0);
  });

  it('refuses a plan option it does not know with 422', async () => {
    const res = await send(viewer, 'post', '/api/analysis', { document: example(), plan: 'all' });
    expect(res.status).toBe(422);
  });
});
