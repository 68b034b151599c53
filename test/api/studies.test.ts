/**
 * Studies as background jobs: the web server queues them (pg-boss), worker processes run
 * them, progress reaches the client as server-sent events, cancel stops a run at once, and
 * a worker killed mid-run (SIGKILL) leaves its study to be resumed from its checkpoint.
 */
import { chainDocumentSchema } from '../../shared/schema/chain';
import { MAX_TRIALS, monteCarloSpecSchema, type StudyDto } from '../../shared/schema/studies';
import { planMonteCarlo, runTrial } from '../../shared/engine/studies';
import { createChain } from '../../server/chains/chain-store';
import { UserSchema } from '../../server/users/user.entity';
import { WorkspaceSchema } from '../../server/workspaces/workspace.entity';
import { createUser, createWorkspace, send, signIn, type Client } from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { startWorker, type WorkerProcess } from './support/study-worker';
import { createTestContext, type TestContext } from './support/test-db';

// Worker processes start with a TypeScript loader and run real analyses on a shared machine.
jest.setTimeout(240_000);

// A trial of this three-stage chain takes about a millisecond at 8,001 points on a quiet
// machine (a fraction of one at 41), so the runs that must still be going when they are
// cancelled, killed or out of time ask for 8,001 points; at 5,000 trials that is above the
// default work cap, which this file therefore raises (the app reads it when it starts).
const LONG_POINTS = 8001;
const MAX_WORK = 400_000_000;
process.env.CW_STUDY_MAX_WORK = String(MAX_WORK);

let ctx: TestContext;
let editor: Client;
let viewer: Client;
let chainId: string;
const workers: WorkerProcess[] = [];

const F0 = 1e6;
const DOC = chainDocumentSchema.parse(
  fixtureChain({
    settings: {
      f0Hz: F0,
      sweep: { startHz: 0.8e6, stopHz: 1.25e6, points: 41, scale: 'lin' },
      targets: { centreMinHz: 0.99e6, centreMaxHz: 1.01e6 },
    },
  }),
);
DOC.stages[1].tolerances = { c: 5, l: 1 };

const mc = (trials: number, seed = 3, points = 41) => ({
  kind: 'monte-carlo',
  distribution: 'uniform',
  trials,
  seed,
  points,
});
const url = (sid = '') => `/api/chains/${chainId}/studies${sid ? `/${sid}` : ''}`;

async function read(sid: string): Promise<StudyDto> {
  const res = await send(viewer, 'get', url(sid));
  expect(res.status).toBe(200);
  return res.body;
}

/** Polls until `test` holds (the study as the API shows it), or fails after `ms`. */
async function waitFor(
  sid: string,
  test: (s: StudyDto) => boolean,
  ms = 180_000,
): Promise<StudyDto> {
  const until = Date.now() + ms;
  for (;;) {
    const s = await read(sid);
    if (test(s)) return s;
    if (Date.now() > until) {
      throw new Error(
        `study never reached the state: ${JSON.stringify({ ...s, result: undefined })}\n${workers.map((w) => w.output()).join('\n')}`,
      );
    }
    await new Promise((r) => setTimeout(r, 150));
  }
}

beforeAll(async () => {
  ctx = await createTestContext();
  const em = ctx.services.orm.em.fork();
  const e = await createUser(em, 'editor@studies.test');
  const v = await createUser(em, 'viewer@studies.test');
  const ws = await createWorkspace(em, 'Studies', [
    [e, 'editor'],
    [v, 'viewer'],
  ]);
  const chain = await createChain(em, {
    workspace: await em.findOneOrFail(WorkspaceSchema, ws.id),
    document: DOC,
    user: await em.findOneOrFail(UserSchema, e.id),
    message: 'studies',
  });
  chainId = chain.id;
  editor = await signIn(ctx.app, 'editor@studies.test');
  viewer = await signIn(ctx.app, 'viewer@studies.test');
});

afterAll(async () => {
  await Promise.all(workers.map((w) => w.stop('SIGKILL')));
  await ctx.close();
});

describe('studies API without a worker', () => {
  it('refuses a study above the work cap with a 422 that names the cap', async () => {
    const res = await send(editor, 'post', url(), { ...mc(10_000), points: 100_001 });
    expect(res.status).toBe(422);
    expect(res.body.error).toBe('study-too-big');
    expect(res.body.message).toMatch(/trials \(10000\) × sweep points \(100001\) × stages \(3\)/);
    expect(res.body.message).toMatch(/above the cap of 400,000,000/);
  });

  it('refuses more trials than allowed, and a gang member the chain lacks, with what to fix', async () => {
    const big = await send(editor, 'post', url(), mc(10_001));
    expect(big.status).toBe(422);
    expect(JSON.stringify(big.body.details)).toMatch(/trials/);
    const band = await send(editor, 'post', url(), {
      kind: 'band',
      gang: [{ stageId: 'nope', key: 'c', min: 1e-12, max: 1e-10 }],
      positions: 5,
    });
    expect(band.status).toBe(422);
    expect(band.body.message).toMatch(/no stage "nope"/);
  });

  it('queues a study (202), lists it for viewers, cancels it while queued, and caps running studies per user', async () => {
    const created = await send(editor, 'post', url(), mc(20));
    expect(created.status).toBe(202);
    expect(created.body).toMatchObject({ status: 'queued', kind: 'monte-carlo', chainVersion: 1 });
    const list = await send(viewer, 'get', url());
    expect(list.body.map((s: StudyDto) => s.id)).toContain(created.body.id);
    const more = [
      await send(editor, 'post', url(), mc(20)),
      await send(editor, 'post', url(), mc(20)),
    ];
    expect(more.map((r) => r.status)).toEqual([202, 202]);
    const refused = await send(editor, 'post', url(), mc(20));
    expect(refused.status).toBe(429);
    expect(refused.body.message).toMatch(/at most 3/);
    for (const s of [created, ...more]) {
      const c = await send(editor, 'post', url(`${s.body.id}/cancel`));
      expect(c.status).toBe(202);
      expect(c.body.status).toBe('cancelled');
    }
    const again = await send(editor, 'post', url(`${created.body.id}/cancel`));
    expect(again.status).toBe(409);
    expect((await send(viewer, 'post', url(`${created.body.id}/cancel`))).status).toBe(403);
  });
});

describe('studies run by worker processes', () => {
  beforeAll(() => {
    workers.push(startWorker(ctx.schema, { CW_STUDY_STALE_S: '2' }));
  });

  it('runs a Monte Carlo study and streams its progress to the end, with the result', async () => {
    const created = await send(editor, 'post', url(), mc(60));
    expect(created.status).toBe(202);
    const res = await viewer.agent
      .get(url(`${created.body.id}/events`))
      .buffer(true)
      .parse((r, cb) => {
        let text = '';
        r.on('data', (c: Buffer) => (text += c.toString()));
        r.on('end', () => cb(null, text));
      });
    expect(res.headers['content-type']).toMatch(/text\/event-stream/);
    const events = String(res.body)
      .split('\n\n')
      .filter((e) => e.startsWith('event:'))
      .map((e) => ({
        event: /^event: (\w+)/.exec(e)![1],
        data: JSON.parse(/\ndata: (.*)$/s.exec(e)![1]),
      }));
    const fractions = events
      .filter((e) => e.event === 'progress')
      .map((e) => e.data.progress?.fraction ?? 0);
    expect(fractions.length).toBeGreaterThan(0);
    fractions.forEach((f, i) => i && expect(f).toBeGreaterThanOrEqual(fractions[i - 1]));
    const end = events.at(-1)!;
    expect(end.event).toBe('end');
    expect(end.data.status).toBe('done');
    expect(end.data.result.trials).toBe(60);
    expect(end.data.result.yield.fraction).toBeGreaterThan(0);
    // The trials are the engine's own, from the seed: trial 5 as computed here.
    const plan = planMonteCarlo({ doc: DOC }, monteCarloSpecSchema.parse(mc(60)));
    const t5 = runTrial({ doc: DOC }, plan, 5);
    expect(end.data.result.rows[5].metrics[0]).toBeCloseTo(t5.metrics[0]!, 0);
  });

  it('cancels a running study within a second of the request', async () => {
    const created = await send(editor, 'post', url(), mc(5000, 3, LONG_POINTS));
    await waitFor(created.body.id, (s) => s.status === 'running' && (s.progress?.done ?? 0) > 0);
    const asked = Date.now();
    expect((await send(editor, 'post', url(`${created.body.id}/cancel`))).status).toBe(202);
    const cancelled = await waitFor(created.body.id, (s) => s.status === 'cancelled', 30_000);
    const tookMs = Date.now() - asked;
    // The worker acts on the request at its next tick (250 ms); allow for a loaded machine.
    expect(tookMs).toBeLessThan(2000);
    expect(cancelled.error).toMatch(/cancelled/);
    const done = cancelled.progress!.done;
    await new Promise((r) => setTimeout(r, 800));
    expect((await read(created.body.id)).progress!.done).toBe(done);
  });

  it('resumes a study from its checkpoint after its worker is killed (SIGKILL)', async () => {
    // Enough trials that the run outlasts the wait for a checkpoint on a quiet machine too
    // (the most a study takes: 4,000 once ran out in 3.3 s, done before the kill).
    const created = await send(editor, 'post', url(), mc(MAX_TRIALS, 11, LONG_POINTS));
    const sid = created.body.id;
    // Wait for a checkpoint (written every 2 s) to be in the database.
    await waitFor(sid, (s) => s.status === 'running' && (s.progress?.done ?? 0) > 40);
    await new Promise((r) => setTimeout(r, 2600));
    const killed = workers.shift()!;
    await killed.stop('SIGKILL');
    const atKill = (await read(sid)).progress!.done;
    workers.push(startWorker(ctx.schema, { CW_STUDY_STALE_S: '2' }));
    // The second run reports where it picked up (the trials in the checkpoint).
    const resumed = await waitFor(
      sid,
      (s) => s.attempts === 2 && Number(s.progress?.interim?.resumedFrom ?? 0) > 0,
    );
    expect(Number(resumed.progress!.interim?.resumedFrom)).toBeLessThanOrEqual(atKill);
    const done = await waitFor(sid, (s) => s.status === 'done');
    const result = done.result as { trials: number; rows: { metrics: (number | null)[] }[] };
    expect(result.trials).toBe(MAX_TRIALS);
    // Trials after the resume are the same as an unbroken run would give.
    const plan = planMonteCarlo({ doc: DOC }, monteCarloSpecSchema.parse(mc(MAX_TRIALS, 11, LONG_POINTS))); // prettier-ignore
    expect(result.rows[MAX_TRIALS - 1].metrics[0]).toBeCloseTo(
      runTrial({ doc: DOC }, plan, MAX_TRIALS - 1).metrics[0]!,
      0,
    );
  });

  it('marks a study failed, with the reason, when its worker dies on its last allowed run', async () => {
    for (const w of workers.splice(0)) await w.stop('SIGTERM');
    const w = startWorker(ctx.schema, { CW_STUDY_STALE_S: '2', CW_STUDY_MAX_ATTEMPTS: '1' });
    workers.push(w);
    const created = await send(editor, 'post', url(), mc(3000, 5, LONG_POINTS));
    await waitFor(created.body.id, (s) => s.status === 'running');
    await workers.shift()!.stop('SIGKILL');
    workers.push(startWorker(ctx.schema, { CW_STUDY_STALE_S: '2', CW_STUDY_MAX_ATTEMPTS: '1' }));
    const failed = await waitFor(created.body.id, (s) => s.status === 'failed');
    expect(failed.error).toMatch(/worker running this study stopped \(killed or crashed\)/);
  });

  it('fails a study that runs past its time budget, with a message saying what to ask for', async () => {
    for (const w of workers.splice(0)) await w.stop('SIGTERM');
    workers.push(startWorker(ctx.schema, { CW_STUDY_BUDGET_S: '1' }));
    const created = await send(editor, 'post', url(), mc(5000, 7, LONG_POINTS));
    const failed = await waitFor(created.body.id, (s) => s.status === 'failed', 60_000);
    expect(failed.error).toMatch(
      /ran past its time budget of 1 s: ask for fewer trials, positions, iterations or sweep points/,
    );
    // It stopped there: nothing near the 5,000 trials was run, and no result is kept.
    expect(failed.progress?.done ?? 0).toBeLessThan(5000);
    expect(failed.result).toBeNull();
  });
});
