/**
 * Analyses run on worker threads within two budgets: stages × sweep points (422 above it)
 * and time (503, the thread replaced); the event loop keeps answering meanwhile.
 */
import { AsyncLocalStorage } from 'node:async_hooks';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import {
  analysesInFlight,
  analysisLimits,
  analysisThreadIds,
  configureAnalysis,
  runOnPool,
  stopAnalysisPool,
} from '../../server/analysis/analysis-pool';
import { chainDocumentSchema, type ChainDocumentInput } from '../../shared/schema/chain';
import { createUser, createWorkspace, send, signIn, type Client } from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { createTestContext, type TestContext } from './support/test-db';

let ctx: TestContext;
let editor: Client;
let wid: string;

beforeAll(async () => {
  ctx = await createTestContext();
  const em = ctx.services.orm.em.fork();
  const user = await createUser(em, 'editor@pool.test');
  wid = (await createWorkspace(em, 'Pool', [[user, 'editor']])).id;
  editor = await signIn(ctx.app, 'editor@pool.test');
});
afterEach(() => configureAnalysis());
afterAll(async () => {
  await stopAnalysisPool();
  await ctx.close();
});

/** The fixture with `pads` attenuator pads before its tank, swept over `points` points. */
function chainOf(pads: number, points: number): ChainDocumentInput {
  const base = fixtureChain();
  const pad = (i: number) => ({
    id: `pad${i}`,
    type: 'attenuator-pad',
    label: `Pad ${i}`,
    values: { db: 1, z0: 5000 },
  });
  return {
    ...base,
    settings: { ...base.settings, sweep: { ...base.settings.sweep, points } },
    stages: [
      base.stages[0],
      ...Array.from({ length: pads }, (_, i) => pad(i)),
      ...base.stages.slice(1),
    ],
  };
}

// Always computed (never a kept answer, server/analysis/answer-cache.ts): these tests are
// about the threads that compute.
const analyse = (doc: ChainDocumentInput) =>
  send(editor, 'post', '/api/analysis', { document: doc, sweep: true }).set(
    'cache-control',
    'no-cache',
  );

describe('the stages × points budget', () => {
  it('should refuse a chain above it with 422 naming the limit and the points that fit', async () => {
    await configureAnalysis({ maxStagePoints: 100_000 });
    const res = await analyse(chainOf(2, 20_001)); // 5 stages × 20,001 points
    expect(res.status).toBe(422);
    expect(res.body.error).toBe('analysis-too-large');
    expect(res.body.message).toContain('100,000');
    expect(res.body.message).toContain('at most 20,000 points');
    expect(res.body.details).toEqual({
      stages: 5,
      points: 20_001,
      maxStagePoints: 100_000,
      maxPoints: 20_000,
    });
    // Exactly at the limit is allowed.
    expect((await analyse(chainOf(2, 20_000))).status).toBe(200);
  });

  it('should save a chain above it with its flags unknown', async () => {
    await configureAnalysis({ maxStagePoints: 1_000 });
    const res = await send(editor, 'post', `/api/workspaces/${wid}/chains`, {
      document: chainOf(0, 2_001),
    });
    expect(res.status).toBe(201);
    expect(res.body.flagCount).toBeNull();
  });
});

describe('the time budget', () => {
  it('should answer 503 when an analysis runs out of time, and replace its thread', async () => {
    await configureAnalysis({ threads: 1, timeoutMs: 60_000 });
    expect((await analyse(chainOf(0, 201))).status).toBe(200);
    const before = analysisThreadIds();
    expect(before).toHaveLength(1);

    // The same pool (one started thread) with a budget far below a 300,000-point analysis.
    await configureAnalysis({ threads: 1, timeoutMs: 50 }, { keepPool: true });
    const slow = await analyse(chainOf(0, 100_001));
    expect(slow.status).toBe(503);
    expect(slow.body.error).toBe('analysis-timeout');
    expect(slow.body.message).toContain('0.05 s');

    await configureAnalysis({ threads: 1, timeoutMs: 60_000 }, { keepPool: true });
    const after = await analyse(chainOf(0, 201));
    expect(after.status).toBe(200);
    expect(analysisThreadIds()).toHaveLength(1);
    expect(analysisThreadIds()).not.toEqual(before);
  });
});

describe('what an analysis leaves behind', () => {
  it("should keep nothing of its request's async context alive once it has answered", async () => {
    // A timer or a thread made while a request is handled holds that request's async
    // context (with its entity manager): a per-analysis time-budget timer kept every request
    // of the last ten seconds alive, and a pool started by a request kept that one for good.
    // Here the pool starts within the request.
    setFlagsFromString('--expose-gc');
    const gc = runInNewContext('gc') as () => void;
    await configureAnalysis({ threads: 1, timeoutMs: 60_000 });
    const context = new AsyncLocalStorage<object>();
    const document = chainDocumentSchema.parse(chainOf(0, 201));
    let held: WeakRef<object> | undefined;
    const outcome = await context.run({ request: 'analysis' }, async () => {
      held = new WeakRef(context.getStore()!);
      return runOnPool({ document, want: 'answer', traces: ['stepUp'] });
    });
    expect(outcome.kind).toBe('answer');
    await new Promise((resolve) => setImmediate(resolve));
    gc();
    expect(held!.deref()).toBeUndefined();
  });
});

describe('a timeout while other analyses wait for a thread', () => {
  it('should answer every analysis (200 or 503) and keep the event loop free after it', async () => {
    await configureAnalysis({ threads: 2, timeoutMs: 60_000 });
    await Promise.all([analyse(chainOf(0, 201)), analyse(chainOf(0, 201))]);
    expect(analysisThreadIds()).toHaveLength(2);
    // One analysis far over a short budget, one long within it, and more queued behind them
    // with later deadlines: the first times out and its thread is replaced while the others
    // still wait on the old pool. (The retired pool's end is what this exercises; the event
    // loop spin that closing it early could cause depends on the order threads finish in.)
    await configureAnalysis({ threads: 2, timeoutMs: 50 }, { keepPool: true });
    // (A supertest request starts when it is awaited or given a callback: `then` starts it.)
    let settled = 0;
    const start = (doc: ChainDocumentInput) =>
      analyse(doc).then((res) => {
        settled++;
        return res;
      });
    const doomed = start(chainOf(7, 100_000));
    const long = start(chainOf(0, 20_001));
    // Both on threads before the queue fills; on a busy machine the second request may reach
    // the pool only after the first has already run out of its 50 ms, so stop waiting then.
    while (analysesInFlight() < 2 && settled === 0) {
      await new Promise((resolve) => setImmediate(resolve));
    }
    const queued = Array.from({ length: 6 }, () => start(chainOf(0, 2_001)));
    const answers = await Promise.all([doomed, long, ...queued]);
    expect(answers[0].status).toBe(503);
    for (const res of answers) expect([200, 503]).toContain(res.status);
    // The event loop is free: health answers, and a new analysis runs to the end.
    await configureAnalysis({ threads: 2, timeoutMs: 120_000 }, { keepPool: true });
    expect((await send(editor, 'get', '/api/health')).status).toBe(200);
    expect((await analyse(chainOf(0, 201))).status).toBe(200);
    expect(analysesInFlight()).toBe(0);
  }, 120_000);
});

describe('the event loop during a maximum-size analysis', () => {
  it('should answer /api/health while the largest analysis the budget allows runs', async () => {
    await configureAnalysis({ threads: 1, timeoutMs: 120_000 });
    // Start the thread first, so the big analysis runs rather than waits for a thread.
    expect((await analyse(chainOf(0, 201))).status).toBe(200);
    const { maxStagePoints } = analysisLimits();
    const pads = 7; // 10 stages
    const points = Math.min(100_001, Math.floor(maxStagePoints / (pads + 3)));
    let bigDone = false;
    const big = analyse(chainOf(pads, points)).then((res) => {
      bigDone = true;
      return res;
    });
    while (analysesInFlight() === 0 && !bigDone) {
      await new Promise((resolve) => setImmediate(resolve));
    }

    const health = [];
    for (let i = 0; i < 3; i++) {
      const res = await send(editor, 'get', '/api/health');
      health.push({ status: res.status, whileBigRan: !bigDone });
    }
    expect(health).toEqual(Array(3).fill({ status: 200, whileBigRan: true }));
    const res = await big;
    expect(res.status).toBe(200);
    expect(res.body.sweep.freqsHz).toHaveLength(points);
  });
});
