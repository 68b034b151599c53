/** Chains: create, list, save with optimistic locking, revisions, restore, duplicates. */
import { analyzeChainForTest } from './support/engine';
import { ChainRevisionSchema } from '../../server/chains/revision.entity';
import { UserSchema } from '../../server/users/user.entity';
import { createUser, createWorkspace, send, signIn, type Client } from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { createTestContext, type TestContext } from './support/test-db';

let ctx: TestContext;
let editor: Client;
let viewer: Client;
let wid: string;

beforeAll(async () => {
  ctx = await createTestContext();
  const em = ctx.services.orm.em.fork();
  const e = await createUser(em, 'editor@chains.test', { displayName: 'Edna' });
  const v = await createUser(em, 'viewer@chains.test');
  wid = (
    await createWorkspace(em, 'Chains', [
      [e, 'editor'],
      [v, 'viewer'],
    ])
  ).id;
  editor = await signIn(ctx.app, 'editor@chains.test');
  viewer = await signIn(ctx.app, 'viewer@chains.test');
});
afterAll(() => ctx.close());

async function create(overrides = {}, name?: string) {
  const res = await send(editor, 'post', `/api/workspaces/${wid}/chains`, {
    document: fixtureChain(overrides),
    ...(name ? { name } : {}),
  });
  expect(res.status).toBe(201);
  return res.body;
}

describe('creating', () => {
  it('should store the document with its columns, version 1 and the caller role', async () => {
    const chain = await create({ name: 'Created one', description: 'for the create test' });
    expect(chain).toMatchObject({
      workspaceId: wid,
      name: 'Created one',
      description: 'for the create test',
      f0Hz: 1e6,
      stageCount: 3,
      version: 1,
      parentId: null,
      createdBy: 'Edna',
      updatedBy: 'Edna',
      role: 'editor',
    });
    // Defaults the schema fills in are stored, so readers get a complete document.
    expect(chain.document.settings.temperatureK).toBe(290);
    expect(chain.document.format).toBe('chainwright-chain');
  });

  it('should count the flags the engine finds at save time', async () => {
    // The fixture's detector loads its tank hard, which the engine flags.
    const chain = await create({ name: 'Flag count' });
    const result = analyzeChainForTest(chain.document);
    const expected = result!.flags.filter(
      (f) => f.severity === 'warning' || f.severity === 'error',
    ).length;
    expect(expected).toBeGreaterThan(0);
    expect(chain.flagCount).toBe(expected);
  });

  it('should create from an example and let a name override the example name', async () => {
    const res = await send(editor, 'post', `/api/workspaces/${wid}/chains`, {
      fromExample: 'test-tank',
      name: 'From the example',
    });
    expect(res.status).toBe(201);
    expect(res.body.name).toBe('From the example');
    expect(res.body.document.stages.map((s: { id: string }) => s.id)).toEqual([
      'src',
      'tank',
      'det',
    ]);
    const revisions = await send(editor, 'get', `/api/chains/${res.body.id}/revisions`);
    expect(revisions.body[0].message).toBe('Created from example test-tank');
  });

  it('should list the examples with their names and descriptions', async () => {
    const res = await send(viewer, 'get', '/api/examples');
    expect(res.body).toEqual([
      {
        key: 'test-tank',
        name: 'Test tank into a detector',
        description: 'A 1 MHz tank fed from a 5 kilohm generator, loaded by a diode detector.',
      },
      {
        key: 'test-tank-light',
        name: 'Test tank, lighter detector load',
        description: expect.any(String),
      },
    ]);
  });

  it('should answer 404 for an example that does not exist', async () => {
    const res = await send(editor, 'post', `/api/workspaces/${wid}/chains`, {
      fromExample: 'no-such-one',
    });
    expect(res.status).toBe(404);
    expect(res.body.message).toContain('no-such-one');
  });

  it('should answer 422 naming the field at fault', async () => {
    const bad = fixtureChain();
    (bad.settings as { f0Hz: unknown }).f0Hz = -5;
    const res = await send(editor, 'post', `/api/workspaces/${wid}/chains`, { document: bad });
    expect(res.status).toBe(422);
    expect(res.body.error).toBe('invalid');
    expect(res.body.details).toContainEqual({
      path: 'document.settings.f0Hz',
      message: 'design frequency must be above 0',
    });
  });

  it('should answer 422 when both a document and an example are sent', async () => {
    const res = await send(editor, 'post', `/api/workspaces/${wid}/chains`, {
      document: fixtureChain(),
      fromExample: 'test-tank',
    });
    expect(res.status).toBe(422);
    expect(res.body.message).toContain('either a document or fromExample');
  });
});

describe('listing', () => {
  let listWid: string;
  beforeAll(async () => {
    const em = ctx.services.orm.em.fork();
    const e = await em.findOneOrFail(UserSchema, { email: 'editor@chains.test' });
    listWid = (await createWorkspace(em, 'Listing', [[e, 'editor']])).id;
    for (const [name, f0Hz, description] of [
      ['Alpha preselector', 3e6, 'two tanks'],
      ['Bravo front end', 1e6, 'with a 50% tap'],
      ['Charlie detector', 2e6, 'crystal set'],
    ] as const) {
      const doc = fixtureChain({
        name,
        description,
        settings: { ...fixtureChain().settings, f0Hz },
      });
      expect(
        (await send(editor, 'post', `/api/workspaces/${listWid}/chains`, { document: doc })).status,
      ).toBe(201);
    }
  });

  const list = (query: string) => send(viewer, 'get', `/api/workspaces/${listWid}/chains?${query}`);

  it('should sort by a column in either direction', async () => {
    const byF0 = await send(editor, 'get', `/api/workspaces/${listWid}/chains?sort=f0Hz&dir=asc`);
    expect(byF0.body.items.map((c: { name: string }) => c.name)).toEqual([
      'Bravo front end',
      'Charlie detector',
      'Alpha preselector',
    ]);
    const byName = await send(
      editor,
      'get',
      `/api/workspaces/${listWid}/chains?sort=name&dir=desc`,
    );
    expect(byName.body.items[0].name).toBe('Charlie detector');
  });

  it('should page with a total', async () => {
    const res = await send(
      editor,
      'get',
      `/api/workspaces/${listWid}/chains?sort=name&dir=asc&page=1&pageSize=2`,
    );
    expect(res.body).toMatchObject({ total: 3, page: 1, pageSize: 2 });
    expect(res.body.items.map((c: { name: string }) => c.name)).toEqual(['Charlie detector']);
    expect(res.body.items[0]).not.toHaveProperty('document');
  });

  it('should search name and description without regard to case, taking % literally', async () => {
    expect((await list('q=ALPHA')).status).toBe(403); // the viewer is not a member here
    const byName = await send(editor, 'get', `/api/workspaces/${listWid}/chains?q=ALPHA`);
    expect(byName.body.items.map((c: { name: string }) => c.name)).toEqual(['Alpha preselector']);
    const byDescription = await send(
      editor,
      'get',
      `/api/workspaces/${listWid}/chains?q=${encodeURIComponent('50%')}`,
    );
    expect(byDescription.body.total).toBe(1);
    const wildcard = await send(
      editor,
      'get',
      `/api/workspaces/${listWid}/chains?q=${encodeURIComponent('%')}`,
    );
    expect(wildcard.body.total).toBe(1);
  });

  it('should answer 422 for a bad sort column', async () => {
    const res = await send(editor, 'get', `/api/workspaces/${listWid}/chains?sort=password`);
    expect(res.status).toBe(422);
    expect(res.body.details[0].path).toBe('sort');
  });
});

describe('saving', () => {
  it('should save with the current version and keep a revision of every save', async () => {
    const chain = await create({ name: 'Saved twice' });
    const v2 = await send(editor, 'put', `/api/chains/${chain.id}`, {
      version: 1,
      document: fixtureChain({ name: 'Saved twice', description: 'second' }),
      message: 'tuned the tank',
    });
    expect(v2.status).toBe(200);
    expect(v2.body).toMatchObject({ version: 2, description: 'second' });
    const revisions = await send(viewer, 'get', `/api/chains/${chain.id}/revisions`);
    expect(
      revisions.body.map((r: { version: number; message: string }) => [r.version, r.message]),
    ).toEqual([
      [2, 'tuned the tank'],
      [1, 'Created'],
    ]);
    expect(revisions.body[0]).not.toHaveProperty('document');
  });

  it('should refuse a stale version with 409, the current version, and write nothing', async () => {
    const chain = await create({ name: 'Contested' });
    const first = await send(editor, 'put', `/api/chains/${chain.id}`, {
      version: 1,
      document: fixtureChain({ name: 'Contested', description: 'first writer' }),
    });
    expect(first.status).toBe(200);
    const stale = await send(editor, 'put', `/api/chains/${chain.id}`, {
      version: 1,
      document: fixtureChain({ name: 'Contested', description: 'second writer' }),
    });
    expect(stale.status).toBe(409);
    expect(stale.body).toMatchObject({ error: 'stale-version', details: { currentVersion: 2 } });
    const stored = await send(viewer, 'get', `/api/chains/${chain.id}`);
    expect(stored.body).toMatchObject({ version: 2, description: 'first writer' });
    const count = await ctx.services.orm.em.fork().count(ChainRevisionSchema, { chain: chain.id });
    expect(count).toBe(2);
  });

  it('should let only one of two racing saves from the same version win', async () => {
    const chain = await create({ name: 'Race' });
    const save = (d: string) =>
      send(editor, 'put', `/api/chains/${chain.id}`, {
        version: 1,
        document: fixtureChain({ name: 'Race', description: d }),
      });
    const statuses = (await Promise.all([save('a'), save('b'), save('c')]))
      .map((r) => r.status)
      .sort();
    expect(statuses).toEqual([200, 409, 409]);
    const count = await ctx.services.orm.em.fork().count(ChainRevisionSchema, { chain: chain.id });
    expect(count).toBe(2);
  });

  it('should answer 422 for a save without a version', async () => {
    const chain = await create({ name: 'No version' });
    const res = await send(editor, 'put', `/api/chains/${chain.id}`, { document: fixtureChain() });
    expect(res.status).toBe(422);
    expect(res.body.details[0].path).toBe('version');
  });
});

describe('revisions and restore', () => {
  it('should read one revision with its document and restore it as a new version', async () => {
    const chain = await create({ name: 'History', description: 'original' });
    await send(editor, 'put', `/api/chains/${chain.id}`, {
      version: 1,
      document: fixtureChain({ name: 'History', description: 'changed' }),
    }).expect(200);
    const r1 = await send(viewer, 'get', `/api/chains/${chain.id}/revisions/1`);
    expect(r1.status).toBe(200);
    expect(r1.body).toMatchObject({
      version: 1,
      author: 'Edna',
      document: { description: 'original' },
    });

    const restored = await send(editor, 'post', `/api/chains/${chain.id}/revisions/1/restore`, {
      version: 2,
    });
    expect(restored.status).toBe(200);
    expect(restored.body).toMatchObject({ version: 3, description: 'original' });
    const list = await send(viewer, 'get', `/api/chains/${chain.id}/revisions`);
    expect(list.body[0]).toMatchObject({ version: 3, message: 'Restored revision 1' });
    expect(list.body).toHaveLength(3);
  });

  it('should refuse a restore from a stale version with 409', async () => {
    const chain = await create({ name: 'Stale restore' });
    await send(editor, 'put', `/api/chains/${chain.id}`, {
      version: 1,
      document: fixtureChain(),
    }).expect(200);
    const res = await send(editor, 'post', `/api/chains/${chain.id}/revisions/1/restore`, {
      version: 1,
    });
    expect(res.status).toBe(409);
    expect(res.body.details).toEqual({ currentVersion: 2 });
  });

  it('should answer 404 for a revision that does not exist', async () => {
    const chain = await create({ name: 'Short history' });
    expect((await send(viewer, 'get', `/api/chains/${chain.id}/revisions/7`)).status).toBe(404);
    expect((await send(viewer, 'get', `/api/chains/${chain.id}/revisions/abc`)).status).toBe(404);
  });
});

describe('duplicating and deleting', () => {
  it('should copy a chain, or link it as a variant of its parent', async () => {
    const parent = await create({ name: 'Parent' });
    const copy = await send(editor, 'post', `/api/chains/${parent.id}/duplicate`, {});
    expect(copy.status).toBe(201);
    expect(copy.body).toMatchObject({ name: 'Parent (copy)', parentId: null, version: 1 });
    const variant = await send(editor, 'post', `/api/chains/${parent.id}/duplicate`, {
      asVariant: true,
      name: 'Wider tank',
      document: fixtureChain({ description: 'unsaved edits' }),
    });
    expect(variant.status).toBe(201);
    expect(variant.body).toMatchObject({
      name: 'Wider tank',
      parentId: parent.id,
      description: 'unsaved edits',
    });
  });

  it('should delete a chain and keep its variants, unlinked', async () => {
    const parent = await create({ name: 'Doomed parent' });
    const variant = await send(editor, 'post', `/api/chains/${parent.id}/duplicate`, {
      asVariant: true,
    });
    expect((await send(editor, 'delete', `/api/chains/${parent.id}`)).status).toBe(204);
    expect((await send(viewer, 'get', `/api/chains/${parent.id}`)).status).toBe(404);
    const kept = await send(viewer, 'get', `/api/chains/${variant.body.id}`);
    expect(kept.body.parentId).toBeNull();
  });

  it('should answer 404 for an id that is not a UUID', async () => {
    expect((await send(viewer, 'get', '/api/chains/not-a-uuid')).status).toBe(404);
  });
});
