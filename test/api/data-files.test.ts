/** Workspace data files: upload, list, read, delete, and their use in the analysis. */
import type { ChainDocumentInput } from '../../shared/schema/chain';
import { createUser, createWorkspace, send, signIn, type Client } from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { createTestContext, type TestContext } from './support/test-db';

// A small loop antenna seen at its terminals, 0.6–1.6 MHz, as S11 (re, im) against 50 Ω.
const ANTENNA_POINTS: [number, number, number][] = [
  [0.6, 0.4, -0.55],
  [0.8, 0.3, -0.62],
  [1.2, 0.1, -0.7],
  [1.6, -0.05, -0.72],
];
const ANTENNA_S1P = [
  '! loop antenna on the bench, terminals at the feed box',
  '# MHz S RI R 50',
  ...ANTENNA_POINTS.map((p) => p.join(' ')),
  '',
].join('\n');

// A preselector filter, magnitude and angle, two points either side of 1 MHz.
const FILTER_S2P = [
  '! two-pole preselector, 1 MHz centre',
  '# MHz S MA R 50',
  '0.9 0.30 40 0.90 -20 0.90 -20 0.32 35',
  '1.0 0.10 10 0.98 -60 0.98 -60 0.12 5',
  '1.1 0.30 -40 0.90 -100 0.90 -100 0.31 -38',
  '',
].join('\n');

// Line 3 has a word where a number belongs.
const BROKEN_S1P = ['! a typing slip', '# MHz S RI R 50', '1.0 0.2 minus0.4', ''].join('\n');

let ctx: TestContext;
let editor: Client;
let viewer: Client;
let outsider: Client;
let wid: string;
let otherWid: string;

beforeAll(async () => {
  ctx = await createTestContext();
  const em = ctx.services.orm.em.fork();
  const e = await createUser(em, 'editor@files.test');
  const v = await createUser(em, 'viewer@files.test');
  await createUser(em, 'outsider@files.test');
  wid = (
    await createWorkspace(em, 'Bench files', [
      [e, 'editor'],
      [v, 'viewer'],
    ])
  ).id;
  otherWid = (await createWorkspace(em, 'Other bench', [[e, 'editor']])).id;
  editor = await signIn(ctx.app, 'editor@files.test');
  viewer = await signIn(ctx.app, 'viewer@files.test');
  outsider = await signIn(ctx.app, 'outsider@files.test');
});
afterAll(() => ctx.close());

async function upload(name: string, content: string, workspaceId = wid) {
  return send(editor, 'post', `/api/workspaces/${workspaceId}/files`, { name, content });
}

/** The fixture chain with its generator swapped for a measured antenna using `fileId`. */
function antennaChain(fileId: string, name = 'Loop into the tank'): ChainDocumentInput {
  const doc = fixtureChain({ name });
  doc.stages[0] = {
    id: 'ant',
    type: 'measured-antenna',
    label: 'Bench loop',
    values: { fieldRms: 50e-6, effectiveHeight: 0.2 },
    dataFileId: fileId,
  };
  return doc;
}

/** Z = Z0(1+S)/(1−S), then linear in frequency between the two points around `fHz`. */
function expectedZ(fHz: number): { re: number; im: number } {
  const z = ANTENNA_POINTS.map(([fMHz, sre, sim]) => {
    const dr = 1 - sre;
    const d = dr * dr + sim * sim;
    const nre = (1 + sre) * dr - sim * sim;
    const nim = sim * dr + (1 + sre) * sim;
    return { f: fMHz * 1e6, re: (50 * nre) / d, im: (50 * nim) / d };
  });
  const hi = z.findIndex((p) => p.f > fHz);
  const a = z[hi - 1];
  const b = z[hi];
  const t = (fHz - a.f) / (b.f - a.f);
  return { re: a.re + (b.re - a.re) * t, im: a.im + (b.im - a.im) * t };
}

describe('data files', () => {
  let antennaId: string;
  let filterId: string;

  it('should store a one-port antenna file and read its points and range', async () => {
    const res = await upload('bench-loop.s1p', ANTENNA_S1P);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      name: 'bench-loop.s1p',
      kind: 's1p',
      portCount: 1,
      pointCount: 4,
      fMinHz: 0.6e6,
      fMaxHz: 1.6e6,
      content: ANTENNA_S1P,
    });
    antennaId = res.body.id;
  });

  it('should take the kind from the port count when the name has no extension', async () => {
    const res = await upload('preselector sweep', FILTER_S2P);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ kind: 's2p', portCount: 2, pointCount: 3 });
    filterId = res.body.id;
  });

  it('should list the files without their text, for viewers too', async () => {
    const res = await send(viewer, 'get', `/api/workspaces/${wid}/files`);
    expect(res.status).toBe(200);
    expect(res.body.map((f: { id: string }) => f.id).sort()).toEqual([antennaId, filterId].sort());
    expect(res.body[0]).not.toHaveProperty('content');
    expect(res.body[0].uploadedBy).toEqual(expect.any(String));
  });

  it('should read one file with its text', async () => {
    const res = await send(viewer, 'get', `/api/workspaces/${wid}/files/${filterId}`);
    expect(res.status).toBe(200);
    expect(res.body.content).toBe(FILTER_S2P);
  });

  it('should not read a file through another workspace', async () => {
    const res = await send(editor, 'get', `/api/workspaces/${otherWid}/files/${filterId}`);
    expect(res.status).toBe(404);
  });

  it('should refuse a malformed file with 422 naming the line', async () => {
    const res = await upload('slip.s1p', BROKEN_S1P);
    expect(res.status).toBe(422);
    expect(res.body.error).toBe('invalid-data-file');
    expect(res.body.message).toContain('line 3');
    expect(res.body.message).toContain('minus0.4');
    expect(res.body.details).toEqual({ line: 3 });
  });

  it('should analyse a measured antenna with the impedance from its file', async () => {
    const doc = antennaChain(antennaId);
    const res = await send(viewer, 'post', '/api/analysis', {
      document: doc,
      sweep: false,
      workspaceId: wid,
    });
    expect(res.status).toBe(200);
    const want = expectedZ(doc.settings!.f0Hz);
    expect(res.body.nodes[0].zSrc.re).toBeCloseTo(want.re, 6);
    expect(res.body.nodes[0].zSrc.im).toBeCloseTo(want.im, 6);
  });

  it('should refuse a chain with a file but no workspace, naming the stage', async () => {
    const res = await send(viewer, 'post', '/api/analysis', {
      document: antennaChain(antennaId),
      sweep: false,
    });
    expect(res.status).toBe(422);
    expect(res.body.message).toContain('Bench loop');
  });

  it('should refuse a file of a workspace the caller is not a member of', async () => {
    const res = await send(outsider, 'post', '/api/analysis', {
      document: antennaChain(antennaId),
      sweep: false,
      workspaceId: wid,
    });
    expect(res.status).toBe(403);
  });

  it('should not let a chain of another workspace use the file', async () => {
    const posted = await send(editor, 'post', '/api/analysis', {
      document: antennaChain(antennaId),
      sweep: false,
      workspaceId: otherWid,
    });
    expect(posted.status).toBe(422);
    expect(posted.body.error).toBe('invalid-chain');
    expect(posted.body.message).toContain('Bench loop');

    const created = await send(editor, 'post', `/api/workspaces/${otherWid}/chains`, {
      document: antennaChain(antennaId, 'Borrowed loop'),
    });
    expect(created.status).toBe(201);
    const saved = await send(editor, 'get', `/api/chains/${created.body.id}/analysis`);
    expect(saved.status).toBe(422);
    expect(saved.body.details).toContainEqual(
      expect.objectContaining({ stageId: 'ant', path: ['stages', 0, 'dataFileId'] }),
    );
  });

  it('should analyse a saved chain with its workspace file and count its flags', async () => {
    const created = await send(editor, 'post', `/api/workspaces/${wid}/chains`, {
      document: antennaChain(antennaId, 'Saved loop'),
    });
    expect(created.status).toBe(201);
    const res = await send(viewer, 'get', `/api/chains/${created.body.id}/analysis`);
    expect(res.status).toBe(200);
    const want = expectedZ(1e6);
    expect(res.body.nodes[0].zSrc.re).toBeCloseTo(want.re, 6);
    const flagged = res.body.flags.filter(
      (f: { severity: string }) => f.severity === 'warning' || f.severity === 'error',
    );
    expect(created.body.flagCount).toBe(flagged.length);
    await send(editor, 'delete', `/api/chains/${created.body.id}`);
  });

  it('should refuse to delete a file a chain uses, naming the chain, and delete it after', async () => {
    const created = await send(editor, 'post', `/api/workspaces/${wid}/chains`, {
      document: antennaChain(antennaId, 'Roof loop receiver'),
    });
    expect(created.status).toBe(201);
    const refused = await send(editor, 'delete', `/api/workspaces/${wid}/files/${antennaId}`);
    expect(refused.status).toBe(409);
    expect(refused.body.error).toBe('data-file-in-use');
    expect(refused.body.message).toContain('Roof loop receiver');

    const removed = await send(editor, 'delete', `/api/chains/${created.body.id}`);
    expect(removed.status).toBe(204);
    const deleted = await send(editor, 'delete', `/api/workspaces/${wid}/files/${antennaId}`);
    expect(deleted.status).toBe(204);
    const list = await send(viewer, 'get', `/api/workspaces/${wid}/files`);
    expect(list.body.map((f: { id: string }) => f.id)).toEqual([filterId]);
  });

  it('should not let a viewer upload or delete', async () => {
    const up = await send(viewer, 'post', `/api/workspaces/${wid}/files`, {
      name: 'x.s1p',
      content: ANTENNA_S1P,
    });
    expect(up.status).toBe(403);
    const del = await send(viewer, 'delete', `/api/workspaces/${wid}/files/${filterId}`);
    expect(del.status).toBe(403);
  });
});
