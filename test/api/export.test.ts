/** Exports: the chain file, the ngspice netlist and Touchstone, for sent and stored chains. */
import { chainDocumentSchema, type ChainDocumentInput } from '../../shared/schema/chain';
import { readTouchstone } from '../../shared/io/touchstone';
import {
  anonymous,
  createUser,
  createWorkspace,
  send,
  signIn,
  type Client,
} from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { createTestContext, type TestContext } from './support/test-db';

let ctx: TestContext;
let viewer: Client;
let editor: Client;
let outsider: Client;
let wid: string;

beforeAll(async () => {
  ctx = await createTestContext();
  const em = ctx.services.orm.em.fork();
  const v = await createUser(em, 'viewer@export.test');
  const e = await createUser(em, 'editor@export.test');
  await createUser(em, 'outsider@export.test');
  wid = (
    await createWorkspace(em, 'Exports', [
      [v, 'viewer'],
      [e, 'editor'],
    ])
  ).id;
  viewer = await signIn(ctx.app, 'viewer@export.test');
  editor = await signIn(ctx.app, 'editor@export.test');
  outsider = await signIn(ctx.app, 'outsider@export.test');
});
afterAll(() => ctx.close());

/** The fixture chain with one more two-port before the detector. */
function withStage(id: string, type: string, label: string): ChainDocumentInput {
  const doc = fixtureChain();
  doc.stages.splice(doc.stages.length - 1, 0, { id, type, label, values: {} });
  return doc;
}

/** Data lines of a Touchstone file: neither comments (!) nor the option line (#). */
function dataLines(text: string): string[] {
  return text.split('\n').filter((l) => l.trim() !== '' && !/^\s*[!#]/.test(l));
}

describe('Touchstone 2.0 export', () => {
  it('should write [Reference] per port and [Noise Data], reading back as the 1.1 file', async () => {
    const doc = withStage('amp', 'unilateral-amplifier', 'Amplifier');
    const v2 = await send(viewer, 'post', '/api/export', {
      document: doc,
      format: 'touchstone',
      z0: 75,
      version: '2.0',
    });
    expect(v2.status).toBe(200);
    expect(v2.headers['content-disposition']).toBe(
      'attachment; filename="test-tank-into-a-detector_75ohm_v2.s2p"',
    );
    const lines = v2.text.split('\n');
    expect(lines[0]).toBe('[Version] 2.0');
    expect(lines).toContain('[Reference] 75 75');
    expect(lines).toContain('[Noise Data]');
    const file = readTouchstone(v2.text, 'export.s2p');
    expect(file.version).toBe('2.0');
    expect(file.z0).toBe(75);
    // The tank and the amplifier make noise: one noise point, at the chain's centre frequency.
    expect(file.noise).toHaveLength(1);
    expect(file.noise[0].fHz).toBe(chainDocumentSchema.parse(doc).settings.f0Hz);
    expect(file.noise[0].nfMinDb).toBeGreaterThan(0);
    expect(file.noise[0].rnOhm).toBeGreaterThan(0);
    expect(Math.hypot(file.noise[0].gammaOpt.re, file.noise[0].gammaOpt.im)).toBeLessThan(1);

    const v1 = await send(viewer, 'post', '/api/export', {
      document: doc,
      format: 'touchstone',
      z0: 75,
    });
    const old = readTouchstone(v1.text, 'export.s2p');
    expect(old.version).toBe('1.1');
    expect(old.noise).toEqual([]);
    expect(Array.from(file.freqsHz)).toEqual(Array.from(old.freqsHz));
    file.s.forEach((v, i) => expect(v).toBeCloseTo(old.s[i], 10));
  });

  it("should name a mode's 2.0 file by chain, mode and reference, [Version] first", async () => {
    const doc = fixtureChain({
      ...withStage('amp', 'unilateral-amplifier', 'Amplifier'),
      name: 'Tank in modes',
      modes: [
        { id: 'tuned', name: 'Tuned', kind: 'receive' },
        { id: 'no-tank', name: 'No tank', kind: 'transmit', bypass: ['tank'] },
      ],
    });
    const res = await send(viewer, 'post', '/api/export', {
      document: doc,
      format: 'touchstone',
      mode: 'tuned',
      version: '2.0',
    });
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toBe(
      'attachment; filename="tank-in-modes_tuned_50ohm_v2.s2p"',
    );
    const lines = res.text.split('\n');
    expect(lines[0]).toBe('[Version] 2.0');
    expect(lines[1]).toBe('! Mode "Tuned" (receive, id tuned)');
    expect(readTouchstone(res.text, 'mode.s2p').noise).toHaveLength(1);
  });

  it('should state no noise data, and why, for a chain with only a shunt tank', async () => {
    // A shunt conductance's noise is least from a short, which no finite Γopt states.
    const res = await send(viewer, 'post', '/api/export', {
      document: fixtureChain(),
      format: 'touchstone',
      version: '2.0',
    });
    expect(res.status).toBe(200);
    expect(res.text).not.toContain('[Noise Data]');
    expect(res.text).toContain('! No noise data:');
    expect(readTouchstone(res.text, 'tank.s2p').noise).toEqual([]);
  });

  it('should refuse a version that is not 1.1 or 2.0 with a message naming both', async () => {
    const res = await send(viewer, 'post', '/api/export', {
      document: fixtureChain(),
      format: 'touchstone',
      version: '3.0',
    });
    expect(res.status).toBe(422);
    expect(JSON.stringify(res.body.details)).toContain('1.1 or 2.0');
  });
});

describe('POST /api/export', () => {
  it('should answer the chain file, which reads back as the same document', async () => {
    const doc = chainDocumentSchema.parse(fixtureChain({ name: 'Tank, "first" try / 2' }));
    const res = await send(viewer, 'post', '/api/export', { document: doc, format: 'json' });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/json/);
    expect(res.headers['content-disposition']).toBe(
      'attachment; filename="tank-first-try-2.chain.json"',
    );
    expect(chainDocumentSchema.parse(JSON.parse(res.text))).toEqual(doc);
  });

  it('should answer an ngspice netlist with a comment per stage and the AC sweep', async () => {
    const doc = fixtureChain();
    const res = await send(editor, 'post', '/api/export', { document: doc, format: 'spice' });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/plain/);
    expect(res.headers['content-disposition']).toBe(
      'attachment; filename="test-tank-into-a-detector.cir"',
    );
    for (const stage of doc.stages) {
      expect(res.text).toMatch(
        new RegExp(`^\\* Stage \\d+ "${stage.label}" \\(${stage.type}\\)`, 'm'),
      );
    }
    expect(res.text).toMatch(/^\.?ac (lin|dec) \d+ 500000 2000000$/m);
    expect(res.text.trimEnd().endsWith('.end')).toBe(true);
  });

  it('should answer Touchstone 1.1 with one data line per sweep point at 50 ohm', async () => {
    const doc = fixtureChain({
      settings: { f0Hz: 1e6, sweep: { startHz: 5e5, stopHz: 2e6, points: 37, scale: 'lin' } },
    });
    const res = await send(viewer, 'post', '/api/export', { document: doc, format: 'touchstone' });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^(text\/plain|application\/octet-stream)/);
    expect(res.headers['content-disposition']).toBe(
      'attachment; filename="test-tank-into-a-detector_50ohm.s2p"',
    );
    const firstNonComment = res.text.split('\n').find((l) => !l.startsWith('!'));
    expect(firstNonComment).toBe('# HZ S RI R 50');
    const data = dataLines(res.text);
    expect(data).toHaveLength(37);
    // Frequency and four complex S-parameters on each line.
    expect(data.every((l) => l.trim().split(/\s+/).length === 9)).toBe(true);
    expect(Number(data[0].split(/\s+/)[0])).toBe(5e5);
    expect(Number(data[36].split(/\s+/)[0])).toBe(2e6);
  });

  it('should write the reference resistance it is given, and different S-parameters', async () => {
    const doc = fixtureChain();
    const at50 = await send(viewer, 'post', '/api/export', { document: doc, format: 'touchstone' });
    const at75 = await send(viewer, 'post', '/api/export', {
      document: doc,
      format: 'touchstone',
      z0: 75,
    });
    expect(at75.status).toBe(200);
    expect(at75.text.split('\n')).toContain('# HZ S RI R 75');
    expect(dataLines(at75.text)).toHaveLength(201);
    expect(dataLines(at75.text)[0]).not.toBe(dataLines(at50.text)[0]);
  });

  it('should refuse a mixer in a netlist and in Touchstone, naming it and what to do', async () => {
    const doc = withStage('mix', 'mixer', 'Front mixer');
    for (const format of ['spice', 'touchstone']) {
      const res = await send(viewer, 'post', '/api/export', { document: doc, format });
      expect(res.status).toBe(422);
      expect(res.body.error).toBe('cannot-export');
      expect(res.body.message).toContain('"Front mixer"');
      expect(res.body.message).toMatch(/remove it|export the stages before or after it/);
      expect(res.body.details).toEqual({ stageId: 'mix' });
    }
  });

  it('should refuse an IF block in a netlist but write it in Touchstone', async () => {
    const doc = withStage('iff', 'if-filter', 'IF block');
    const spice = await send(viewer, 'post', '/api/export', { document: doc, format: 'spice' });
    expect(spice.status).toBe(422);
    expect(spice.body.error).toBe('cannot-export');
    expect(spice.body.message).toContain('"IF block"');
    expect(spice.body.message).toContain('remove it or replace it with lumped parts');
    const s2p = await send(viewer, 'post', '/api/export', { document: doc, format: 'touchstone' });
    expect(s2p.status).toBe(200);
  });

  it('should answer 422 invalid-chain with the issues for a chain the engine refuses', async () => {
    const doc = fixtureChain();
    doc.stages[1] = { ...doc.stages[1], type: 'no-such-stage-type' };
    for (const format of ['spice', 'touchstone']) {
      const res = await send(viewer, 'post', '/api/export', { document: doc, format });
      expect(res.status).toBe(422);
      expect(res.body.error).toBe('invalid-chain');
      expect(res.body.details).toContainEqual(
        expect.objectContaining({ stageId: 'tank', path: ['stages', 1, 'type'] }),
      );
    }
  });

  it('should answer 422 from the schema for an unknown format, a bad z0 or a malformed chain', async () => {
    const doc = fixtureChain();
    const pdf = await send(viewer, 'post', '/api/export', { document: doc, format: 'pdf' });
    expect(pdf.status).toBe(422);
    expect(pdf.body.error).toBe('invalid');
    expect(pdf.body.details.map((d: { path: string }) => d.path)).toEqual(['format']);

    const z0 = await send(viewer, 'post', '/api/export', {
      document: doc,
      format: 'touchstone',
      z0: -50,
    });
    expect(z0.status).toBe(422);
    expect(z0.body.details.map((d: { path: string }) => d.path)).toEqual(['z0']);

    const bad = await send(viewer, 'post', '/api/export', {
      document: { name: 'x' },
      format: 'json',
    });
    expect(bad.status).toBe(422);
    expect(bad.body.details.map((d: { path: string }) => d.path)).toContain('document.settings');
  });

  it('should answer 401 to a caller who is not signed in', async () => {
    const res = await send(await anonymous(ctx.app), 'post', '/api/export', {
      document: fixtureChain(),
      format: 'json',
    });
    expect(res.status).toBe(401);
    expect(res.body.error).toBe('not-signed-in');
  });
});

describe('GET /api/chains/:id/export', () => {
  let chainId: string;
  let stored: unknown;

  beforeAll(async () => {
    const created = await send(editor, 'post', `/api/workspaces/${wid}/chains`, {
      document: fixtureChain({ name: 'Stored tank' }),
    });
    expect(created.status).toBe(201);
    chainId = created.body.id;
    stored = created.body.document;
  });

  it('should give a viewer each format of the stored chain', async () => {
    const json = await send(viewer, 'get', `/api/chains/${chainId}/export?format=json`);
    expect(json.status).toBe(200);
    expect(json.headers['content-disposition']).toBe(
      'attachment; filename="stored-tank.chain.json"',
    );
    expect(JSON.parse(json.text)).toEqual(stored);

    const spice = await send(viewer, 'get', `/api/chains/${chainId}/export?format=spice`);
    expect(spice.status).toBe(200);
    expect(spice.headers['content-disposition']).toBe('attachment; filename="stored-tank.cir"');
    expect(spice.text).toContain('* Stage 2 "Tank" (shunt-lc-tank)');

    const s2p = await send(viewer, 'get', `/api/chains/${chainId}/export?format=touchstone&z0=300`);
    expect(s2p.status).toBe(200);
    expect(s2p.headers['content-disposition']).toBe(
      'attachment; filename="stored-tank_300ohm.s2p"',
    );
    expect(s2p.text.split('\n')).toContain('# HZ S RI R 300');

    const v2 = await send(
      viewer,
      'get',
      `/api/chains/${chainId}/export?format=touchstone&version=2`,
    );
    expect(v2.status).toBe(200);
    expect(v2.headers['content-disposition']).toBe(
      'attachment; filename="stored-tank_50ohm_v2.s2p"',
    );
    const file = readTouchstone(v2.text, 'stored.s2p');
    expect(file.version).toBe('2.0');
    expect(file.z0).toBe(50);
  });

  it('should answer 422 for a missing or unknown format and a z0 that is not a resistance', async () => {
    for (const query of [
      '',
      '?format=gerber',
      '?format=touchstone&z0=abc',
      '?format=touchstone&z0=0',
      '?format=touchstone&version=3',
    ]) {
      const res = await send(viewer, 'get', `/api/chains/${chainId}/export${query}`);
      expect(res.status).toBe(422);
      expect(res.body.error).toBe('invalid');
    }
  });

  it('should refuse callers outside the workspace and anonymous ones', async () => {
    const url = `/api/chains/${chainId}/export?format=json`;
    expect((await send(outsider, 'get', url)).status).toBe(403);
    expect((await send(await anonymous(ctx.app), 'get', url)).status).toBe(401);
  });
});
