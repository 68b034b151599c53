/** Read-only links: signed-out reading and export, revocation and expiry at once, no writes. */
import request from 'supertest';
import { ShareLinkSchema } from '../../server/sharing/share-link.entity';
import {
  anonymous,
  createUser,
  createWorkspace,
  send,
  signIn,
  type Client,
} from './support/agents';
import { chainDocumentSchema } from '../../shared/schema/chain';
import { fixtureChain } from './support/chain-fixture';
import { analyzeChainForTest } from './support/engine';
import { recordMail } from './support/mail';
import { createTestContext, type TestContext } from './support/test-db';

let ctx: TestContext;
let editor: Client;
let viewer: Client;
let chainId: string;
const PUBLIC = 'https://rx.example.org';

beforeAll(async () => {
  ctx = await createTestContext({ publicUrl: PUBLIC });
  recordMail(ctx);
  const em = ctx.services.orm.em.fork();
  const e = await createUser(em, 'edie@share.test', { displayName: 'Edie' });
  const v = await createUser(em, 'vic@share.test');
  const wid = (
    await createWorkspace(em, 'Sharing', [
      [e, 'editor'],
      [v, 'viewer'],
    ])
  ).id;
  editor = await signIn(ctx.app, 'edie@share.test');
  viewer = await signIn(ctx.app, 'vic@share.test');
  const created = await send(editor, 'post', `/api/workspaces/${wid}/chains`, {
    document: fixtureChain(),
  });
  chainId = created.body.id;
});
afterAll(() => ctx.close());

const tokenOf = (url: string) => url.split('/shared/')[1];

describe('read-only links', () => {
  it('should open the chain and its analysis signed out, and export it', async () => {
    const made = await send(editor, 'post', `/api/chains/${chainId}/share-links`, {});
    expect(made.status).toBe(201);
    expect(made.body.url).toMatch(new RegExp(`^${PUBLIC}/shared/[A-Za-z0-9_-]{43}$`));
    expect(made.body.expiresAt).toBeNull();
    const token = tokenOf(made.body.url);
    // Only the hash is stored.
    const row = await ctx.services.orm.em.fork().findOneOrFail(ShareLinkSchema, made.body.id);
    expect(row.tokenHash).not.toContain(token);

    const res = await request(ctx.app).get(`/api/shared/${token}`);
    expect(res.status).toBe(200);
    expect(res.headers['set-cookie']).toBeUndefined();
    expect(res.body).toMatchObject({
      name: 'Test tank into a detector',
      workspaceName: 'Sharing',
      version: 1,
    });
    expect(res.body.document.stages.map((s: { id: string }) => s.id)).toEqual([
      'src',
      'tank',
      'det',
    ]);
    expect(res.body.analysis.f0Hz).toBe(1e6);
    expect(res.body.analysis.stages.length).toBeGreaterThan(0);
    expect(res.body.analysis.sweep.freqsHz.length).toBe(201);

    // The stage types' names and units, for a reader without an account.
    const types = await request(ctx.app).get(`/api/shared/${token}/catalogue`);
    expect(types.status).toBe(200);
    expect(types.body.map((t: { type: string }) => t.type).sort()).toEqual(
      ['envelope-detector', 'resistive-generator', 'shunt-lc-tank'].sort(),
    );
    const tank = types.body.find((t: { type: string }) => t.type === 'shunt-lc-tank');
    expect(tank.params.find((p: { key: string }) => p.key === 'l')).toMatchObject({
      label: expect.stringMatching(/inductance/i),
      unit: 'henry',
    });

    const netlist = await request(ctx.app).get(`/api/shared/${token}/export?format=spice`);
    expect(netlist.status).toBe(200);
    expect(netlist.headers['content-disposition']).toContain('test-tank-into-a-detector.cir');
  });

  it("should write the flag sentences at the reader's figures, and refuse figures out of range", async () => {
    const made = await send(editor, 'post', `/api/chains/${chainId}/share-links`, {});
    const token = tokenOf(made.body.url);
    const doc = chainDocumentSchema.parse(fixtureChain());
    const six = analyzeChainForTest(doc, 6)!.flags.map((f) => f.message);
    expect(six).not.toEqual(analyzeChainForTest(doc)!.flags.map((f) => f.message));
    const res = await request(ctx.app).get(`/api/shared/${token}?figures=6`);
    expect(res.status).toBe(200);
    expect(res.body.analysis.flags.map((f: { message: string }) => f.message)).toEqual(six);
    for (const figures of ['9', '1', '2.5', 'four']) {
      const bad = await request(ctx.app).get(`/api/shared/${token}?figures=${figures}`);
      expect([figures, bad.status]).toEqual([figures, 422]);
      expect(bad.body.message).toContain('figures must be a whole number from 2 to 8');
    }
  });

  it('should answer 404 right after the link is revoked', async () => {
    const made = await send(editor, 'post', `/api/chains/${chainId}/share-links`, {
      expiresInDays: 7,
    });
    const token = tokenOf(made.body.url);
    expect((await request(ctx.app).get(`/api/shared/${token}`)).status).toBe(200);
    const list = await send(editor, 'get', `/api/chains/${chainId}/share-links`);
    expect(list.body.map((l: { id: string }) => l.id)).toContain(made.body.id);
    expect(list.body[0].url).toBeUndefined();
    await send(editor, 'delete', `/api/chains/${chainId}/share-links/${made.body.id}`).expect(204);
    const after = await request(ctx.app).get(`/api/shared/${token}`);
    expect(after.status).toBe(404);
    expect(after.body.message).toContain('withdrawn');
    expect((await request(ctx.app).get(`/api/shared/${token}/export?format=json`)).status).toBe(
      404,
    );
    expect((await request(ctx.app).get(`/api/shared/${token}/catalogue`)).status).toBe(404);
  });

  it('should stop working at its expiry', async () => {
    const made = await send(editor, 'post', `/api/chains/${chainId}/share-links`, {
      expiresInDays: 1,
    });
    await ctx.services.orm.em
      .fork()
      .nativeUpdate(ShareLinkSchema, { id: made.body.id }, { expiresAt: new Date(Date.now() - 1) });
    expect((await request(ctx.app).get(`/api/shared/${tokenOf(made.body.url)}`)).status).toBe(404);
  });

  it('should never write through a link, and refuse links to viewers', async () => {
    const made = await send(editor, 'post', `/api/chains/${chainId}/share-links`, {});
    const token = tokenOf(made.body.url);
    const visitor = await anonymous(ctx.app);
    for (const method of ['post', 'put', 'patch', 'delete'] as const) {
      const res = await send(visitor, method, `/api/shared/${token}`, { name: 'changed' });
      expect({ method, status: res.status }).toEqual({ method, status: 404 });
    }
    const chain = await send(editor, 'get', `/api/chains/${chainId}`);
    expect(chain.body.version).toBe(1);
    expect((await send(viewer, 'post', `/api/chains/${chainId}/share-links`, {})).status).toBe(403);
    expect((await request(ctx.app).get('/api/shared/short')).status).toBe(404);
  });

  it('should mail a colleague a link to the chain with a note', async () => {
    const sent = (ctx as TestContext & { sent: { to: string; text: string; html: string }[] }).sent;
    const res = await send(viewer, 'post', `/api/chains/${chainId}/send`, {
      email: 'bench@lab.test',
      note: 'Compare with the bench <sweep>',
    });
    expect(res.status).toBe(202);
    expect(res.body.mail.sent).toBe(true);
    const mail = sent.find((m) => m.to === 'bench@lab.test')!;
    expect(mail.text).toContain(`${PUBLIC}/w/`);
    expect(mail.text).toContain('> Compare with the bench <sweep>');
    // The note is escaped in the HTML form.
    expect(mail.html).toContain('Compare with the bench &lt;sweep&gt;');
  });
});
