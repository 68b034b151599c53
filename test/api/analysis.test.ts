/** Analysis routes answer what the engine computes, and the engine's refusals as 422. */
import { catalogue } from '../../shared/engine';
import { chainDocumentSchema } from '../../shared/schema/chain';
import { createUser, createWorkspace, send, signIn, type Client } from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { analyzeChainForTest } from './support/engine';
import { createTestContext, type TestContext } from './support/test-db';

let ctx: TestContext;
let viewer: Client;
let editor: Client;
let wid: string;
let outsider: Client;

beforeAll(async () => {
  ctx = await createTestContext();
  const em = ctx.services.orm.em.fork();
  const v = await createUser(em, 'viewer@analysis.test');
  const e = await createUser(em, 'editor@analysis.test');
  wid = (
    await createWorkspace(em, 'Analysis', [
      [v, 'viewer'],
      [e, 'editor'],
    ])
  ).id;
  viewer = await signIn(ctx.app, 'viewer@analysis.test');
  editor = await signIn(ctx.app, 'editor@analysis.test');
  await createUser(em, 'outsider@analysis.test');
  outsider = await signIn(ctx.app, 'outsider@analysis.test');
});
afterAll(() => ctx.close());

describe('analysis', () => {
  it('should answer POST /api/analysis with what the engine computes', async () => {
    const doc = chainDocumentSchema.parse(fixtureChain());
    const expected = analyzeChainForTest(doc);
    const res = await send(viewer, 'post', '/api/analysis', { document: doc, sweep: false });
    expect(res.status).toBe(200);
    expect(res.body.flags).toEqual(expected!.flags);
    expect(res.body.flags.length).toBeGreaterThan(0);
    expect(res.body.nodes).toHaveLength(expected!.nodes.length);
    expect(res.body.sweep).toBeUndefined();
  });

  it('should write the flag sentences to the figures the client asks for', async () => {
    const doc = chainDocumentSchema.parse(fixtureChain());
    const three = analyzeChainForTest(doc)!.flags.map((f) => f.message);
    const five = analyzeChainForTest(doc, 5)!.flags.map((f) => f.message);
    expect(five).not.toEqual(three); // the fixture has a sentence whose figures show the change
    const res = await send(viewer, 'post', '/api/analysis', { document: doc, sweep: false, figures: 5 }); // prettier-ignore
    expect(res.status).toBe(200);
    expect(res.body.flags.map((f: { message: string }) => f.message)).toEqual(five);
    const plain = await send(viewer, 'post', '/api/analysis', { document: doc, sweep: false });
    expect(plain.body.flags.map((f: { message: string }) => f.message)).toEqual(three);
  });

  it.each([1, 9, 2.5, '4'])('should answer 422 for figures %p', async (figures) => {
    const doc = fixtureChain();
    const res = await send(viewer, 'post', '/api/analysis', { document: doc, figures });
    expect(res.status).toBe(422);
    expect(res.body.error).toBe('invalid');
    expect(res.body.details).toContainEqual(
      expect.objectContaining({ path: 'figures', message: 'figures must be a whole number from 2 to 8' }), // prettier-ignore
    );
  });

  it('should answer 422 with the engine issues for a stage type it does not know', async () => {
    const doc = fixtureChain();
    doc.stages[1] = { ...doc.stages[1], type: 'no-such-stage-type' };
    const res = await send(viewer, 'post', '/api/analysis', { document: doc });
    expect(res.status).toBe(422);
    expect(res.body.error).toBe('invalid-chain');
    expect(res.body.details).toContainEqual(
      expect.objectContaining({ stageId: 'tank', path: ['stages', 1, 'type'] }),
    );
  });

  it('should answer 422 from the schema before the engine sees a malformed chain', async () => {
    const res = await send(viewer, 'post', '/api/analysis', { document: { name: 'x' } });
    expect(res.status).toBe(422);
    expect(res.body.error).toBe('invalid');
    expect(res.body.details.map((d: { path: string }) => d.path)).toContain('document.settings');
  });

  it('should analyse a stored chain, with the sweep when asked', async () => {
    const created = await send(editor, 'post', `/api/workspaces/${wid}/chains`, {
      document: fixtureChain({
        stages: fixtureChain().stages.map((s, i) => (i === 1 ? { ...s, type: 'x-unknown' } : s)),
      }),
    });
    // Saving never depends on the engine; a chain it refuses has its flags unknown, not 0.
    expect(created.status).toBe(201);
    expect(created.body.flagCount).toBeNull();
    const listed = await send(viewer, 'get', `/api/workspaces/${wid}/chains`);
    const row = listed.body.items.find((c: { id: string }) => c.id === created.body.id);
    expect(row.flagCount).toBeNull();
    const refused = await send(viewer, 'get', `/api/chains/${created.body.id}/analysis`);
    expect(refused.status).toBe(422);

    const good = await send(editor, 'post', `/api/workspaces/${wid}/chains`, {
      document: fixtureChain(),
    });
    expect(analyzeChainForTest(good.body.document)).not.toBeNull();
    const res = await send(viewer, 'get', `/api/chains/${good.body.id}/analysis?sweep=1`);
    expect(res.status).toBe(200);
    expect(res.body.sweep.freqsHz).toHaveLength(201);
  });

  it('should check the chain or workspace and the membership at once: 404, 403, then 200', async () => {
    const doc = fixtureChain();
    const created = await send(editor, 'post', `/api/workspaces/${wid}/chains`, { document: doc });
    const url = `/api/chains/${created.body.id}/analysis`;
    expect((await send(viewer, 'get', url)).status).toBe(200);
    const stranger = await send(outsider, 'get', url);
    expect(stranger.status).toBe(403);
    expect(stranger.body.error).toBe('not-member');
    const missing = await send(viewer, 'get', '/api/chains/00000000-0000-4000-8000-000000000000/analysis'); // prettier-ignore
    expect(missing.status).toBe(404);
    expect(missing.body.message).toBe('no such chain');

    const body = { document: doc, sweep: false };
    expect((await send(viewer, 'post', '/api/analysis', { ...body, workspaceId: wid })).status).toBe(200); // prettier-ignore
    const notMember = await send(outsider, 'post', '/api/analysis', { ...body, workspaceId: wid });
    expect(notMember.status).toBe(403);
    expect(notMember.body.error).toBe('not-member');
    const noWorkspace = await send(viewer, 'post', '/api/analysis', {
      ...body,
      workspaceId: '00000000-0000-4000-8000-000000000000',
    });
    expect(noWorkspace.status).toBe(404);
    expect(noWorkspace.body.message).toBe('no such workspace');
  });

  it('should list the catalogue with every stage type and no functions', async () => {
    const res = await send(viewer, 'get', '/api/catalogue');
    expect(res.status).toBe(200);
    expect(res.body.map((t: { type: string }) => t.type)).toEqual(catalogue().map((t) => t.type));
    expect(res.body[0]).not.toHaveProperty('build');
  });
});
