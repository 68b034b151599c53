/**
 * Every route that runs the engine runs it on the analysis threads: while the largest request
 * of each kind that the stages × points budget allows is being analysed, /api/health answers
 * before that request ends, and the engine never builds a chain on the event loop (the
 * threads run their own bundle of it, which this process's spy does not see); one point more
 * is refused with 422 (a shared link is still shown, with the reason in place of its figures).
 */
import request from 'supertest';
import {
  analysesInFlight,
  analysisLimits,
  configureAnalysis,
  stopAnalysisPool,
} from '../../server/analysis/analysis-pool';
import * as build from '../../shared/engine/core/build';
import type { ChainDocumentInput } from '../../shared/schema/chain';
import { createUser, createWorkspace, send, signIn, type Client } from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { createTestContext, type TestContext } from './support/test-db';

// Each case analyses a million stage-points or so; a busy machine needs the room.
jest.setTimeout(600_000);

let ctx: TestContext;
let editor: Client;
let wid: string;

beforeAll(async () => {
  ctx = await createTestContext();
  const em = ctx.services.orm.em.fork();
  const user = await createUser(em, 'editor@offloop.test');
  wid = (await createWorkspace(em, 'Off the loop', [[user, 'editor']])).id;
  editor = await signIn(ctx.app, 'editor@offloop.test');
  // One thread, started before the first big request, so that request runs rather than waits.
  await configureAnalysis({ threads: 1, timeoutMs: 300_000 });
  const warm = await send(editor, 'post', '/api/analysis', { document: fixtureChain() });
  expect(warm.status).toBe(200);
});
afterAll(async () => {
  await stopAnalysisPool();
  await configureAnalysis();
  await ctx.close();
});

/** Stages of every chain below: the fixture's three and seven pads. */
const STAGES = 10;
const TANK_MODES: NonNullable<ChainDocumentInput['modes']> = [
  { id: 'tuned', name: 'Tuned', kind: 'receive' },
  { id: 'octave-down', name: 'Octave down', kind: 'state', values: { tank: { c: 1.0132e-9 } } },
  { id: 'no-tank', name: 'No tank', kind: 'transmit', bypass: ['tank'] },
];

/** The fixture with attenuator pads before its tank, over `points` points, maybe in modes. */
function chainOf(points: number, withModes = false): ChainDocumentInput {
  const base = fixtureChain();
  const pads = Array.from({ length: STAGES - 3 }, (_, i) => ({
    id: `pad${i}`,
    type: 'attenuator-pad',
    label: `Pad ${i}`,
    values: { db: 1, z0: 5000 },
  }));
  return {
    ...base,
    ...(withModes ? { modes: TANK_MODES } : {}),
    settings: { ...base.settings, sweep: { ...base.settings.sweep, points } },
    stages: [base.stages[0], ...pads, ...base.stages.slice(1)],
  };
}

/** Most points a chain analysed `runs` times may have (stages × points × runs ≤ budget). */
const maxPoints = (runs: number) =>
  Math.min(100_001, Math.floor(analysisLimits().maxStagePoints / (STAGES * runs)));

/**
 * Starts `big`, waits until its analysis is on the pool, asks /api/health, and says whether
 * health answered before `big` ended, how many chains the engine built on the event loop
 * meanwhile, and how `big` ended.
 */
async function healthWhile(big: () => PromiseLike<request.Response>) {
  const builds = jest.spyOn(build, 'buildChain');
  let bigDone = false;
  const running = Promise.resolve(big()).then((res) => {
    bigDone = true;
    return res;
  });
  while (analysesInFlight() === 0 && !bigDone) {
    await new Promise((resolve) => setImmediate(resolve));
  }
  const health = await request(ctx.app).get('/api/health');
  const beforeBigEnded = !bigDone;
  const answer = await running;
  const onEventLoop = builds.mock.calls.length;
  builds.mockRestore();
  return { health: health.status, beforeBigEnded, onEventLoop, big: answer };
}

async function storedChain(doc: ChainDocumentInput): Promise<string> {
  const res = await send(editor, 'post', `/api/workspaces/${wid}/chains`, { document: doc });
  expect(res.status).toBe(201);
  return res.body.id;
}

describe('the event loop while the largest request of each kind runs', () => {
  it('every mode analysed (three modes)', async () => {
    const points = maxPoints(3);
    const run = await healthWhile(() =>
      send(editor, 'post', '/api/analysis', { document: chainOf(points, true), allModes: true }),
    );
    expect(run).toMatchObject({
      health: 200,
      beforeBigEnded: true,
      onEventLoop: 0,
      big: { status: 200 },
    });
    expect(run.big.body.modes).toHaveLength(3);
    const over = await send(editor, 'post', '/api/analysis', {
      document: chainOf(points + 1, true),
      allModes: true,
    });
    expect(over.status).toBe(422);
    expect(over.body.error).toBe('analysis-too-large');
  });

  it('a shared link of a chain with modes (its analysis and each mode’s)', async () => {
    const points = maxPoints(4);
    const link = async (doc: ChainDocumentInput) => {
      const id = await storedChain(doc);
      const made = await send(editor, 'post', `/api/chains/${id}/share-links`, {});
      return `/api/shared/${String(made.body.url).split('/shared/')[1]}`;
    };
    const url = await link(chainOf(points, true));
    const run = await healthWhile(() => request(ctx.app).get(url));
    expect(run).toMatchObject({
      health: 200,
      beforeBigEnded: true,
      onEventLoop: 0,
      big: { status: 200 },
    });
    expect(run.big.body.analysis.sweep.freqsHz).toHaveLength(points);
    expect(run.big.body.modes.map((m: { id: string }) => m.id)).toEqual(TANK_MODES.map((m) => m.id)); // prettier-ignore
    expect(run.big.body.modes[1].analysis.sweep.freqsHz).toHaveLength(points);

    const over = await request(ctx.app).get(await link(chainOf(points + 1, true)));
    expect(over.status).toBe(200);
    expect(over.body.analysis).toBeNull();
    expect(over.body.analysisError).toContain("above the server's limit");
    expect(over.body.modes).toBeUndefined();
  });

  it('a Touchstone export (the cascade at every point)', async () => {
    const points = maxPoints(1);
    const exportOf = (doc: ChainDocumentInput) =>
      send(editor, 'post', '/api/export', { document: doc, format: 'touchstone' });
    const run = await healthWhile(() => exportOf(chainOf(points)));
    expect(run).toMatchObject({
      health: 200,
      beforeBigEnded: true,
      onEventLoop: 0,
      big: { status: 200 },
    });
    const lines = run.big.text.split('\n').filter((l) => /^\s*\d/.test(l));
    expect(lines).toHaveLength(points);

    const over = await exportOf(chainOf(points + 1));
    expect(over.status).toBe(422);
    expect(over.body.error).toBe('analysis-too-large');
  });

  it('a design assistant (snap to E12)', async () => {
    const points = maxPoints(1);
    const snap = (doc: ChainDocumentInput) =>
      send(editor, 'post', '/api/design/snap', { document: doc, series: 'E12' });
    const run = await healthWhile(() => snap(chainOf(points)));
    expect(run).toMatchObject({
      health: 200,
      beforeBigEnded: true,
      onEventLoop: 0,
      big: { status: 200 },
    });
    expect(run.big.body.changes.length).toBeGreaterThan(0);

    const over = await snap(chainOf(points + 1));
    expect(over.status).toBe(422);
    expect(over.body.error).toBe('analysis-too-large');
  });

  it('a revision diff (both revisions analysed)', async () => {
    const points = maxPoints(1);
    const doc = chainOf(points);
    const id = await storedChain(doc);
    const next = { ...doc, stages: doc.stages.map((s) => (s.id === 'tank' ? { ...s, values: { ...s.values, c: 5.066e-10 } } : s)) }; // prettier-ignore
    expect((await send(editor, 'put', `/api/chains/${id}`, { version: 1, document: next })).status).toBe(200); // prettier-ignore
    const run = await healthWhile(() => send(editor, 'get', `/api/chains/${id}/diff?from=1&to=2`));
    expect(run).toMatchObject({
      health: 200,
      beforeBigEnded: true,
      onEventLoop: 0,
      big: { status: 200 },
    });
    expect(run.big.body.values).toContainEqual(expect.objectContaining({ stageId: 'tank' }));
    expect(run.big.body.figures.length).toBeGreaterThan(0);
  });
});
