/** A chain's family: its root and every variant below it, within one workspace. */
import { ChainSchema } from '../../server/chains/chain.entity';
import { createUser, createWorkspace, send, signIn, type Client } from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { createTestContext, type TestContext } from './support/test-db';

let ctx: TestContext;
let editor: Client;
let viewer: Client;
let outsider: Client;
let wid: string;
let otherWid: string;

beforeAll(async () => {
  ctx = await createTestContext();
  const em = ctx.services.orm.em.fork();
  const e = await createUser(em, 'editor@family.test');
  const v = await createUser(em, 'viewer@family.test');
  const o = await createUser(em, 'outsider@family.test');
  wid = (
    await createWorkspace(em, 'Family', [
      [e, 'editor'],
      [v, 'viewer'],
    ])
  ).id;
  otherWid = (await createWorkspace(em, 'Elsewhere', [[o, 'editor']])).id;
  editor = await signIn(ctx.app, 'editor@family.test');
  viewer = await signIn(ctx.app, 'viewer@family.test');
  outsider = await signIn(ctx.app, 'outsider@family.test');
});
afterAll(() => ctx.close());

async function create(client: Client, workspaceId: string, name: string): Promise<string> {
  const res = await send(client, 'post', `/api/workspaces/${workspaceId}/chains`, {
    document: fixtureChain({ name }),
  });
  expect(res.status).toBe(201);
  return res.body.id;
}

async function variantOf(parentId: string, name: string): Promise<string> {
  const res = await send(editor, 'post', `/api/chains/${parentId}/duplicate`, {
    asVariant: true,
    name,
  });
  expect(res.status).toBe(201);
  return res.body.id;
}

async function family(client: Client, id: string) {
  const res = await send(client, 'get', `/api/chains/${id}/family`);
  expect(res.status).toBe(200);
  return res.body as { id: string; name: string; parentId: string | null }[];
}

describe('chain family', () => {
  let root: string;
  let single: string;
  let pair: string;
  let pairTuned: string;
  let stranger: string;

  beforeAll(async () => {
    root = await create(editor, wid, 'Preselector');
    single = await variantOf(root, 'Preselector, one tank');
    pair = await variantOf(root, 'Preselector, coupled pair');
    pairTuned = await variantOf(pair, 'Preselector, coupled pair, retuned');
    // A chain of another workspace that (against the rules) names a family member as its
    // parent: the family must never reach outside the workspace.
    stranger = await create(outsider, otherWid, 'Foreign copy');
    await ctx.services.orm.em.fork().nativeUpdate(ChainSchema, { id: stranger }, { parent: pair });
    await create(editor, wid, 'Unrelated chain');
  });

  it('should list the root first, then its variants and a variant of a variant', async () => {
    const members = await family(viewer, root);
    expect(members.map((m) => m.name)).toEqual([
      'Preselector',
      'Preselector, one tank',
      'Preselector, coupled pair',
      'Preselector, coupled pair, retuned',
    ]);
    expect(members[0].parentId).toBeNull();
    expect(members.find((m) => m.id === pairTuned)?.parentId).toBe(pair);
  });

  it('should give the same family from any member', async () => {
    const fromRoot = (await family(viewer, root)).map((m) => m.id);
    for (const id of [single, pair, pairTuned]) {
      expect((await family(viewer, id)).map((m) => m.id)).toEqual(fromRoot);
    }
  });

  it('should never list a chain of another workspace', async () => {
    const ids = (await family(editor, pair)).map((m) => m.id);
    expect(ids).not.toContain(stranger);
    expect(ids).toHaveLength(4);
    // The foreign chain's own family stops at its workspace's edge: it is its own root.
    expect((await family(outsider, stranger)).map((m) => m.id)).toEqual([stranger]);
  });

  it('should answer a chain without relatives with itself alone', async () => {
    const lone = await create(editor, wid, 'Lone chain');
    const members = await family(viewer, lone);
    expect(members).toHaveLength(1);
    expect(members[0]).toMatchObject({ id: lone, name: 'Lone chain', parentId: null });
  });

  it('should answer 404 for a missing chain and 403 for a non-member', async () => {
    const missing = '00000000-0000-4000-8000-000000000000';
    expect((await send(viewer, 'get', `/api/chains/${missing}/family`)).status).toBe(404);
    expect((await send(viewer, 'get', '/api/chains/not-a-uuid/family')).status).toBe(404);
    const refused = await send(outsider, 'get', `/api/chains/${root}/family`);
    expect(refused.status).toBe(403);
    expect(refused.body.error).toBe('not-member');
  });

  it('should count variants in the workspace list', async () => {
    const res = await send(viewer, 'get', `/api/workspaces/${wid}/chains?pageSize=200`);
    const counts = Object.fromEntries(
      (res.body.items as { id: string; variantCount: number }[]).map((c) => [c.id, c.variantCount]),
    );
    expect(counts[root]).toBe(2);
    expect(counts[pair]).toBe(1);
    expect(counts[single]).toBe(0);
  });
});
