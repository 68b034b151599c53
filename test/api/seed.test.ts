/** The demo seed adds what is missing and nothing else, however often it runs. */
import path from 'node:path';
import { ChainSchema } from '../../server/chains/chain.entity';
import { ChainRevisionSchema } from '../../server/chains/revision.entity';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, DEMO_WORKSPACE } from '../../server/seed/demo-accounts';
import { seedDemo } from '../../server/seed/seed-demo';
import { UserSchema } from '../../server/users/user.entity';
import { MembershipSchema } from '../../server/workspaces/membership.entity';
import { WorkspaceSchema } from '../../server/workspaces/workspace.entity';
import { send, signIn } from './support/agents';
import { createTestContext, FIXTURES, type TestContext } from './support/test-db';

const EXAMPLES = path.join(FIXTURES, 'examples');
let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
});
afterAll(() => ctx.close());

async function counts() {
  const em = ctx.services.orm.em.fork();
  return {
    users: await em.count(UserSchema),
    workspaces: await em.count(WorkspaceSchema),
    memberships: await em.count(MembershipSchema),
    chains: await em.count(ChainSchema),
    revisions: await em.count(ChainRevisionSchema),
  };
}

describe('demo seed', () => {
  it('should load the accounts, the workspace and every example, linking variants', async () => {
    const report = await seedDemo(ctx.services.orm.em.fork(), EXAMPLES);
    expect(report).toEqual({
      usersCreated: 3,
      workspacesCreated: 1,
      membershipsCreated: 3,
      chainsCreated: 2,
    });
    const em = ctx.services.orm.em.fork();
    const chains = await em.find(
      ChainSchema,
      {},
      { populate: ['workspace'], orderBy: { name: 'asc' } },
    );
    expect(chains.map((c) => [c.name, c.workspace.name])).toEqual([
      ['Test tank into a detector', DEMO_WORKSPACE],
      ['Test tank, lighter detector load', DEMO_WORKSPACE],
    ]);
    expect(chains[1].parent?.id).toBe(chains[0].id);
    expect(chains[0].parent).toBeNull();
  });

  it('should change nothing when run again', async () => {
    const before = await counts();
    const report = await seedDemo(ctx.services.orm.em.fork(), EXAMPLES);
    expect(report).toEqual({
      usersCreated: 0,
      workspacesCreated: 0,
      membershipsCreated: 0,
      chainsCreated: 0,
    });
    expect(await counts()).toEqual(before);
  });

  it('should keep a user edit to a seeded chain across runs', async () => {
    const owner = await signIn(ctx.app, DEMO_ACCOUNTS[0].email, DEMO_PASSWORD);
    const chain = await ctx.services.orm.em
      .fork()
      .findOneOrFail(ChainSchema, { name: 'Test tank into a detector' });
    const edited = { ...chain.document, description: 'edited by the demo owner' };
    await send(owner, 'put', `/api/chains/${chain.id}`, { version: 1, document: edited }).expect(
      200,
    );
    await seedDemo(ctx.services.orm.em.fork(), EXAMPLES);
    const after = await ctx.services.orm.em.fork().findOneOrFail(ChainSchema, chain.id);
    expect(after.description).toBe('edited by the demo owner');
    expect(after.version).toBe(2);
  });

  it('should give each demo account its role and the owner the site admin role', async () => {
    for (const account of DEMO_ACCOUNTS) {
      const client = await signIn(ctx.app, account.email, DEMO_PASSWORD);
      const me = await client.agent.get('/api/me');
      expect(me.body.user.siteRole).toBe(account.siteAdmin ? 'admin' : 'user');
      expect(me.body.memberships).toEqual([
        expect.objectContaining({ workspaceName: DEMO_WORKSPACE, role: account.role }),
      ]);
    }
  });
});
