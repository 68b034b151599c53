/**
 * Modes through the API: the analysis of one mode or of every mode, saved chains carrying
 * their modes, exports and share links naming the mode.
 */
import request from 'supertest';
import { analyzeChain } from '../../shared/engine';
import { chainDocumentSchema, type ChainDocumentInput } from '../../shared/schema/chain';
import { createUser, createWorkspace, send, signIn, type Client } from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { createTestContext, type TestContext } from './support/test-db';

let ctx: TestContext;
let viewer: Client;
let editor: Client;
let wid: string;

beforeAll(async () => {
  ctx = await createTestContext();
  const em = ctx.services.orm.em.fork();
  const v = await createUser(em, 'viewer@modes.test');
  const e = await createUser(em, 'editor@modes.test');
  wid = (
    await createWorkspace(em, 'Modes', [
      [v, 'viewer'],
      [e, 'editor'],
    ])
  ).id;
  viewer = await signIn(ctx.app, 'viewer@modes.test');
  editor = await signIn(ctx.app, 'editor@modes.test');
});
afterAll(() => ctx.close());

/**
 * The 1 MHz fixture tank in three modes: as tuned, with four times the capacitance (tuned an
 * octave down, to 0.5 MHz: f = 1/(2π√(LC))), and with the tank left out.
 */
function modalChain(): ChainDocumentInput {
  return fixtureChain({
    name: 'Tank in modes',
    modes: [
      { id: 'tuned', name: 'Tuned', kind: 'receive' },
      { id: 'octave-down', name: 'Octave down', kind: 'state', values: { tank: { c: 1.0132e-9 } } },
      { id: 'no-tank', name: 'No tank', kind: 'transmit', bypass: ['tank'] },
    ],
  });
}

const parsed = () => chainDocumentSchema.parse(modalChain());

describe('analysis in a mode', () => {
  it('should answer the mode asked for, as the engine computes it', async () => {
    const doc = parsed();
    for (const mode of ['tuned', 'octave-down', 'no-tank']) {
      const res = await send(viewer, 'post', '/api/analysis', {
        document: doc,
        sweep: false,
        mode,
      });
      expect(res.status).toBe(200);
      const expected = analyzeChain(doc, { sweep: false, mode });
      expect(res.body.mode).toEqual(expect.objectContaining({ id: mode }));
      expect(res.body.nodes).toHaveLength(expected.nodes.length);
      expect(res.body.flags).toEqual(expected.flags);
    }
    // The modes really differ: leaving the tank out removes a node.
    const tuned = analyzeChain(doc, { sweep: false, mode: 'tuned' });
    const bare = analyzeChain(doc, { sweep: false, mode: 'no-tank' });
    expect(bare.nodes.length).toBe(tuned.nodes.length - 1);
  });

  it('should answer every mode at once, each with its name, kind and result', async () => {
    const doc = parsed();
    const res = await send(viewer, 'post', '/api/analysis', {
      document: doc,
      sweep: true,
      traces: ['stepUp'],
      allModes: true,
    });
    expect(res.status).toBe(200);
    expect(
      res.body.modes.map((m: { id: string; name: string; kind: string; ok: boolean }) => [
        m.id,
        m.name,
        m.kind,
        m.ok,
      ]),
    ).toEqual([
      ['tuned', 'Tuned', 'receive', true],
      ['octave-down', 'Octave down', 'state', true],
      ['no-tank', 'No tank', 'transmit', true],
    ]);
    for (const entry of res.body.modes) {
      const expected = analyzeChain(doc, { sweep: false, mode: entry.id });
      expect(entry.result.flags).toEqual(expected.flags);
      expect(entry.result.sweep.freqsHz).toHaveLength(doc.settings.sweep.points);
    }
    // A chain tuned an octave down peaks an octave down: its step-up at 0.5 MHz beats the
    // tuned chain's there (the sweep runs 0.5–2 MHz, log, so 0.5 MHz is the first point).
    const lastNodeAtStart = (entry: { result: { sweep: { stepUpDb: number[][] } } }) =>
      entry.result.sweep.stepUpDb.at(-1)![0];
    expect(lastNodeAtStart(res.body.modes[1])).toBeGreaterThan(lastNodeAtStart(res.body.modes[0]));
  });

  it('should answer a chain without modes as one entry, as written', async () => {
    const res = await send(viewer, 'post', '/api/analysis', {
      document: fixtureChain(),
      sweep: false,
      allModes: true,
    });
    expect(res.status).toBe(200);
    expect(res.body.modes).toHaveLength(1);
    expect(res.body.modes[0]).toEqual(expect.objectContaining({ id: null, ok: true }));
  });

  it('should give a refused mode its reason while the other modes are analysed', async () => {
    const doc = modalChain();
    doc.modes![1] = { ...doc.modes![1], values: { tank: { c: -1e-9 } } };
    const res = await send(viewer, 'post', '/api/analysis', {
      document: doc,
      sweep: false,
      allModes: true,
    });
    expect(res.status).toBe(200);
    expect(res.body.modes.map((m: { ok: boolean }) => m.ok)).toEqual([true, false, true]);
    expect(res.body.modes[1].message).toMatch(/\S/);
    expect(res.body.modes[1].issues.length).toBeGreaterThan(0);
  });

  it('should answer 422 naming the mode for a mode the chain does not have', async () => {
    const res = await send(viewer, 'post', '/api/analysis', {
      document: modalChain(),
      mode: 'receive-2',
    });
    expect(res.status).toBe(422);
    expect(res.body.error).toBe('invalid-chain');
    expect(res.body.message).toContain('receive-2');
  });

  it('should refuse with 422 a mode that names a stage the chain lacks', async () => {
    const doc = modalChain();
    doc.modes![2] = { ...doc.modes![2], bypass: ['no-such-stage'] };
    const res = await send(viewer, 'post', '/api/analysis', { document: doc, mode: 'tuned' });
    expect(res.status).toBe(422);
    expect(JSON.stringify(res.body)).toContain('no-such-stage');
  });
});

describe('stored chains with modes', () => {
  let chainId: string;

  beforeAll(async () => {
    const created = await send(editor, 'post', `/api/workspaces/${wid}/chains`, {
      document: modalChain(),
    });
    expect(created.status).toBe(201);
    chainId = created.body.id;
  });

  it('should keep the modes through a save and a read', async () => {
    const res = await send(viewer, 'get', `/api/chains/${chainId}`);
    expect(res.status).toBe(200);
    expect(res.body.document.modes).toEqual(parsed().modes);
  });

  it('should analyse a stored chain in a mode, and in every mode', async () => {
    const one = await send(viewer, 'get', `/api/chains/${chainId}/analysis?mode=no-tank`);
    expect(one.status).toBe(200);
    expect(one.body.mode.id).toBe('no-tank');
    expect(one.body.flags).toEqual(analyzeChain(parsed(), { sweep: false, mode: 'no-tank' }).flags);
    const all = await send(viewer, 'get', `/api/chains/${chainId}/analysis?modes=all`);
    expect(all.status).toBe(200);
    expect(all.body.modes.map((m: { id: string }) => m.id)).toEqual([
      'tuned',
      'octave-down',
      'no-tank',
    ]);
  });

  it('should answer 422 for a modes query other than "all"', async () => {
    const res = await send(viewer, 'get', `/api/chains/${chainId}/analysis?modes=some`);
    expect(res.status).toBe(422);
    expect(JSON.stringify(res.body.details)).toContain('modes');
  });

  it('should export a mode with the mode in the file name and the header', async () => {
    const spice = await send(viewer, 'get', `/api/chains/${chainId}/export?format=spice&mode=no-tank`); // prettier-ignore
    expect(spice.status).toBe(200);
    expect(spice.headers['content-disposition']).toBe(
      'attachment; filename="tank-in-modes_no-tank.cir"',
    );
    const lines = spice.text.split('\n');
    expect(lines[0]).toBe('Chainwright chain "Tank in modes"');
    expect(lines[1]).toBe('* Mode "No tank" (transmit, id no-tank)');
    // The tank is left out of this mode, so the netlist has no stage for it.
    expect(spice.text).not.toMatch(/^\* Stage \d+ "Tank"/m);
    expect(spice.text).toMatch(/^\* Stage \d+ "Detector"/m);

    const s2p = await send(viewer, 'get', `/api/chains/${chainId}/export?format=touchstone&mode=octave-down`); // prettier-ignore
    expect(s2p.status).toBe(200);
    expect(s2p.headers['content-disposition']).toBe(
      'attachment; filename="tank-in-modes_octave-down_50ohm.s2p"',
    );
    expect(s2p.text.split('\n')[0]).toBe('! Mode "Octave down" (state, id octave-down)');
  });

  it('should export the engine formats of a chain with modes in its first mode, named', async () => {
    const spice = await send(viewer, 'get', `/api/chains/${chainId}/export?format=spice`);
    expect(spice.headers['content-disposition']).toBe(
      'attachment; filename="tank-in-modes_tuned.cir"',
    );
    expect(spice.text.split('\n')[1]).toBe('* Mode "Tuned" (receive, id tuned)');
  });

  it('should export the whole chain file without a mode, and one mode flattened with it', async () => {
    const whole = await send(viewer, 'get', `/api/chains/${chainId}/export?format=json`);
    expect(whole.headers['content-disposition']).toBe(
      'attachment; filename="tank-in-modes.chain.json"',
    );
    expect(JSON.parse(whole.text).modes).toHaveLength(3);

    const one = await send(viewer, 'get', `/api/chains/${chainId}/export?format=json&mode=octave-down`); // prettier-ignore
    expect(one.headers['content-disposition']).toBe(
      'attachment; filename="tank-in-modes_octave-down.chain.json"',
    );
    const flat = chainDocumentSchema.parse(JSON.parse(one.text));
    expect(flat.modes).toBeUndefined();
    expect(flat.description).toMatch(/^Mode "Octave down" \(state\) of the chain "Tank in modes"/);
    expect(flat.stages.find((s) => s.id === 'tank')!.values.c).toBe(1.0132e-9);
  });

  it('should answer 422 for an export in a mode the chain does not have', async () => {
    const res = await send(viewer, 'get', `/api/chains/${chainId}/export?format=spice&mode=band-9`); // prettier-ignore
    expect(res.status).toBe(422);
    expect(res.body.error).toBe('unknown-mode');
    expect(res.body.message).toContain('"tuned", "octave-down", "no-tank"');
  });

  it('should export the document sent in the mode asked for', async () => {
    const res = await send(editor, 'post', '/api/export', {
      document: modalChain(),
      format: 'spice',
      mode: 'octave-down',
    });
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toBe(
      'attachment; filename="tank-in-modes_octave-down.cir"',
    );
  });

  it('should give a share link every mode with its analysis, and its exports by mode', async () => {
    const made = await send(editor, 'post', `/api/chains/${chainId}/share-links`, {});
    expect(made.status).toBe(201);
    const token = String(made.body.url).split('/shared/')[1];
    const res = await request(ctx.app).get(`/api/shared/${token}`);
    expect(res.status).toBe(200);
    expect(res.body.modes.map((m: { id: string; kind: string }) => [m.id, m.kind])).toEqual([
      ['tuned', 'receive'],
      ['octave-down', 'state'],
      ['no-tank', 'transmit'],
    ]);
    for (const mode of res.body.modes) {
      const expected = analyzeChain(parsed(), { sweep: false, mode: mode.id });
      expect(mode.analysis.flags).toEqual(expected.flags);
    }
    const exported = await request(ctx.app).get(
      `/api/shared/${token}/export?format=spice&mode=octave-down`,
    );
    expect(exported.status).toBe(200);
    expect(exported.headers['content-disposition']).toBe(
      'attachment; filename="tank-in-modes_octave-down.cir"',
    );
  });
});
