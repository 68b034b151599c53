/** Design routes: the engine's assistants on a sent chain, and their refusals as 422. */
import { createUser, createWorkspace, send, signIn, type Client } from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { createTestContext, type TestContext } from './support/test-db';

// The assistants analyse the chain many times; a busy machine needs the room.
jest.setTimeout(60_000);

let ctx: TestContext;
let viewer: Client;
let outsider: Client;
let wid: string;

beforeAll(async () => {
  ctx = await createTestContext();
  const em = ctx.services.orm.em.fork();
  const v = await createUser(em, 'viewer@design.test');
  await createUser(em, 'outsider@design.test');
  wid = (await createWorkspace(em, 'Design', [[v, 'viewer']])).id;
  viewer = await signIn(ctx.app, 'viewer@design.test');
  outsider = await signIn(ctx.app, 'outsider@design.test');
});
afterAll(() => ctx.close());

const tank = { stageId: 'tank', label: 'tank' };

describe('design routes', () => {
  it('tunes the fixture tank to 1.1 MHz: 1/(4π²f²L) for the lightly loaded tank', async () => {
    const res = await send(viewer, 'post', '/api/design/tune', {
      document: fixtureChain(),
      workspaceId: wid,
      resonator: tank,
      element: { stageId: 'tank', key: 'c' },
      targetHz: 1.1e6,
    });
    expect(res.status).toBe(200);
    expect(Math.abs(res.body.resonanceHz / 1.1e6 - 1)).toBeLessThan(1e-6);
    // Thomson's formula (common practice) for 100 µH at 1.1 MHz: 209.3 pF in all, of which
    // the detector's own input capacitance is part, so the tank's C comes out a little less.
    const thomson = 1 / ((2 * Math.PI * 1.1e6) ** 2 * 100e-6);
    expect(res.body.value).toBeLessThan(thomson);
    expect(Math.abs(res.body.value / thomson - 1)).toBeLessThan(0.03);
  });

  it('tunes the pass-band peak at the last node, and asks for a resonator or a node when neither is named', async () => {
    const body = {
      document: fixtureChain(),
      element: { stageId: 'tank', key: 'c' },
      targetHz: 1.1e6,
    };
    const nodes = fixtureChain().stages.length - 2; // two-ports between source and load
    const res = await send(viewer, 'post', '/api/design/tune', { ...body, peakNode: nodes });
    expect(res.status).toBe(200);
    expect(res.body.target).toBe('peak');
    expect(Math.abs(res.body.resonanceHz / 1.1e6 - 1)).toBeLessThan(1e-6);
    const none = await send(viewer, 'post', '/api/design/tune', body);
    expect(none.status).toBe(422);
    expect(JSON.stringify(none.body)).toMatch(/peakNode/);
  });

  it('lists tune candidates of the tank', async () => {
    const res = await send(viewer, 'post', '/api/design/tune/candidates', {
      document: fixtureChain(),
      resonator: tank,
    });
    expect(res.status).toBe(200);
    const keys = res.body.map((c: { stageId: string; key: string }) => `${c.stageId}.${c.key}`);
    // The tank's own L and C, then the detector's input capacitance beside it.
    expect(keys).toEqual(['tank.l', 'tank.c', 'det.c']);
  });

  it('answers 422 naming the value when it cannot tune with it', async () => {
    const res = await send(viewer, 'post', '/api/design/tune', {
      document: fixtureChain(),
      resonator: tank,
      element: { stageId: 'tank', key: 'nothing' },
      targetHz: 1e6,
    });
    expect(res.status).toBe(422);
    expect(res.body.message).toMatch(/no inductance or capacitance "nothing"/);
  });

  it('lists matching candidates after the generator, each with whole-chain figures', async () => {
    const res = await send(viewer, 'post', '/api/design/match-here', {
      document: fixtureChain(),
      afterStageId: 'src',
      zSource: { re: 50, im: 0 },
      zLoad: { re: 1000, im: -200 },
      q: 8,
    });
    expect(res.status).toBe(200);
    expect(res.body.candidates.length).toBeGreaterThanOrEqual(4);
    for (const c of res.body.candidates) {
      expect(c.stages.length).toBeGreaterThan(0);
      expect(typeof c.figures.totalGainDb).toBe('number');
    }
  });

  it("writes the answer's texts at the asked figures, and refuses figures out of range", async () => {
    const body = {
      document: fixtureChain(),
      afterStageId: 'src',
      zSource: { re: 50, im: 0 },
      zLoad: { re: 1000, im: -200 },
      q: 8,
    };
    // The two sections meet at √(50 · 1000) = 223.6068 Ω.
    const meeting = async (extra: object) => {
      const res = await send(viewer, 'post', '/api/design/match-here', { ...body, ...extra });
      expect(res.status).toBe(200);
      return res.body.candidates
        .map((c: { title: string }) => c.title)
        .find((t: string) => t.startsWith('Two L'));
    };
    expect(await meeting({})).toMatch(/^Two L-sections through 223\.6 Ω:/);
    expect(await meeting({ figures: 6 })).toMatch(/^Two L-sections through 223\.607 Ω:/);
    expect(await meeting({ figures: 2 })).toMatch(/^Two L-sections through 220 Ω:/);
    for (const figures of [9, 1, 2.5, 'four']) {
      const bad = await send(viewer, 'post', '/api/design/match-here', { ...body, figures });
      expect([figures, bad.status]).toEqual([figures, 422]);
      expect(bad.body.message).toContain('figures must be a whole number from 2 to 8');
    }
  });

  it('answers 422 for a q of zero before the engine sees it', async () => {
    const res = await send(viewer, 'post', '/api/design/match-here', {
      document: fixtureChain(),
      afterStageId: 'src',
      q: 0,
    });
    expect(res.status).toBe(422);
  });

  it('snaps the chain to E12 with before and after', async () => {
    const res = await send(viewer, 'post', '/api/design/snap', {
      document: fixtureChain(),
      series: 'E12',
    });
    expect(res.status).toBe(200);
    // 253.3 pF → 270 pF (nearer in ratio than 220 pF).
    expect(res.body.changes).toContainEqual(
      expect.objectContaining({ stageId: 'tank', key: 'c', after: 270e-12 }),
    );
    expect(res.body.resonators[0].shiftHz).toBeLessThan(0);
  });

  it('answers 422 for an unknown series', async () => {
    const res = await send(viewer, 'post', '/api/design/snap', {
      document: fixtureChain(),
      series: 'E7',
    });
    expect(res.status).toBe(422);
    expect(JSON.stringify(res.body)).toMatch(/E6, E12, E24, E48, E96/);
  });

  it('lists the tank’s parts with coil turns, and refuses a pitch finer than the wire', async () => {
    const ok = await send(viewer, 'post', '/api/design/parts', {
      document: fixtureChain(),
      stageId: 'tank',
      coilForm: { formerDiameterM: 0.03, lengthM: 0.05 },
    });
    expect(ok.status).toBe(200);
    expect(ok.body.rows.find((r: { key: string }) => r.key === 'l').winding.turns).toBeGreaterThan(
      10,
    );
    expect(ok.body.csv).toContain('Wheeler');
  });

  it('keeps another workspace’s files out of reach', async () => {
    const res = await send(outsider, 'post', '/api/design/snap', {
      document: fixtureChain(),
      workspaceId: wid,
      series: 'E12',
    });
    expect(res.status).toBe(403);
  });
});
