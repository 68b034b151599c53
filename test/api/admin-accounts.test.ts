/**
 * Site admins deactivate, reactivate and delete accounts; what happens to the account's
 * sessions, workspaces and chains.
 */
import { chainDocumentSchema } from '../../shared/schema/chain';
import { createChain } from '../../server/chains/chain-store';
import { ChainSchema } from '../../server/chains/chain.entity';
import { UserSchema, type User } from '../../server/users/user.entity';
import { MembershipSchema } from '../../server/workspaces/membership.entity';
import { WorkspaceSchema, type Workspace } from '../../server/workspaces/workspace.entity';
import {
  anonymous,
  createUser,
  createWorkspace,
  PASSWORD,
  send,
  signIn,
  type Client,
} from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { createTestContext, type TestContext } from './support/test-db';

// Calls sign in (scrypt) and analyse: give them room on a busy shared machine.
jest.setTimeout(30_000);

let ctx: TestContext;
let admin: Client;
let adminUser: User;

beforeAll(async () => {
  ctx = await createTestContext();
  adminUser = await createUser(ctx.services.orm.em.fork(), 'admin@accounts.test', {
    siteRole: 'admin',
  });
  admin = await signIn(ctx.app, 'admin@accounts.test');
}, 60_000);
afterAll(() => ctx.close());

const fork = () => ctx.services.orm.em.fork();

async function chainIn(workspace: Workspace, author: User, name: string) {
  const em = fork();
  return createChain(em, {
    workspace: await em.findOneOrFail(WorkspaceSchema, workspace.id),
    document: chainDocumentSchema.parse(fixtureChain({ name })),
    user: await em.findOneOrFail(UserSchema, author.id),
    message: 'test',
  });
}

describe('deactivating an account', () => {
  it('should end its sessions, refuse its sign-in with a reason, and allow it again once reactivated', async () => {
    const user = await createUser(fork(), 'paused@accounts.test');
    const session = await signIn(ctx.app, 'paused@accounts.test');
    expect((await send(session, 'get', '/api/me')).status).toBe(200);

    const off = await send(admin, 'patch', `/api/admin/users/${user.id}`, { active: false });
    expect(off.status).toBe(200);
    expect(off.body).toMatchObject({ id: user.id, active: false, deleted: false });
    expect((await send(session, 'get', '/api/me')).status).toBe(401);

    const client = await anonymous(ctx.app);
    const refused = await send(client, 'post', '/api/auth/login', {
      email: 'paused@accounts.test',
      password: PASSWORD,
    });
    expect(refused.status).toBe(403);
    expect(refused.body.error).toBe('account-deactivated');
    // A wrong password learns nothing about the account's state.
    const wrong = await send(client, 'post', '/api/auth/login', {
      email: 'paused@accounts.test',
      password: 'not-the-password',
    });
    expect(wrong.status).toBe(401);

    const on = await send(admin, 'patch', `/api/admin/users/${user.id}`, { active: true });
    expect(on.body.active).toBe(true);
    expect(
      (await send(await signIn(ctx.app, 'paused@accounts.test'), 'get', '/api/me')).status,
    ).toBe(200);
  });

  it('should not let an admin deactivate or delete their own account', async () => {
    const res = await send(admin, 'patch', `/api/admin/users/${adminUser.id}`, { active: false });
    expect(res.status).toBe(409);
    expect(res.body.error).toBe('own-account');
    expect((await send(admin, 'delete', `/api/admin/users/${adminUser.id}`)).status).toBe(409);
  });

  it('should refuse unknown fields and unknown accounts clearly', async () => {
    const user = await createUser(fork(), 'strict@accounts.test');
    const bad = await send(admin, 'patch', `/api/admin/users/${user.id}`, { siteRole: 'admin' });
    expect(bad.status).toBe(422);
    const missing = await send(
      admin,
      'delete',
      '/api/admin/users/9e1d4c2a-3b7f-4a55-8c1e-2f4b6d8a0c11',
    );
    expect(missing.status).toBe(404);
  });
});

describe('deleting an account', () => {
  it('should delete its own workspaces, leave shared ones with their chains, and erase it', async () => {
    const em = fork();
    const leaver = await createUser(em, 'leaver@accounts.test', { displayName: 'Lee Leaver' });
    const colleague = await createUser(em, 'colleague@accounts.test');
    const solo = await createWorkspace(em, 'Lee alone', [[leaver, 'owner']]);
    const shared = await createWorkspace(em, 'Shared bench', [
      [colleague, 'owner'],
      [leaver, 'editor'],
    ]);
    const soloChain = await chainIn(solo, leaver, 'Private receiver');
    const sharedChain = await chainIn(shared, leaver, 'Bench receiver');
    const session = await signIn(ctx.app, 'leaver@accounts.test');

    const res = await send(admin, 'delete', `/api/admin/users/${leaver.id}`);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      deletedWorkspaces: [{ id: solo.id, name: 'Lee alone', chainCount: 1 }],
      leftWorkspaces: [{ id: shared.id, name: 'Shared bench', chainCount: 1 }],
    });

    const check = fork();
    expect(await check.count(WorkspaceSchema, { id: solo.id })).toBe(0);
    expect(await check.count(ChainSchema, { id: soloChain.id })).toBe(0);
    expect(await check.count(MembershipSchema, { user: leaver.id })).toBe(0);
    const kept = await check.findOneOrFail(ChainSchema, sharedChain.id, {
      populate: ['createdBy'],
    });
    expect(kept.createdBy.displayName).toBe('Deleted account');
    const erased = await check.findOneOrFail(UserSchema, leaver.id);
    expect(erased.email).not.toContain('leaver');
    expect(erased.deletedAt).toBeInstanceOf(Date);

    expect((await send(session, 'get', '/api/me')).status).toBe(401);
    // The address is free again: registering with it is accepted (202: the account exists once
    // the address is confirmed by the mailed link).
    const again = await send(await anonymous(ctx.app), 'post', '/api/auth/register', {
      email: 'leaver@accounts.test',
      displayName: 'Lee again',
      password: 'a-new-long-password',
    });
    expect(again.status).toBe(202);
    const list = await send(admin, 'get', '/api/admin/users');
    const rows = list.body.filter((u: { id: string }) => u.id === leaver.id);
    expect(rows).toEqual([expect.objectContaining({ deleted: true, active: false })]);
  });

  it('should refuse while it is the last owner of a workspace others use, then go on', async () => {
    const em = fork();
    const owner = await createUser(em, 'sole-owner@accounts.test');
    const member = await createUser(em, 'member@accounts.test');
    const ws = await createWorkspace(em, 'Club station', [
      [owner, 'owner'],
      [member, 'viewer'],
    ]);
    const refused = await send(admin, 'delete', `/api/admin/users/${owner.id}`);
    expect(refused.status).toBe(409);
    expect(refused.body.error).toBe('last-owner');
    expect(refused.body.message).toContain('Club station');
    expect(await fork().count(UserSchema, { id: owner.id, deletedAt: null })).toBe(1);

    await fork().nativeUpdate(
      MembershipSchema,
      { workspace: ws.id, user: member.id },
      { role: 'owner' },
    );
    const done = await send(admin, 'delete', `/api/admin/users/${owner.id}`);
    expect(done.status).toBe(200);
    expect(done.body.leftWorkspaces.map((w: { name: string }) => w.name)).toEqual(['Club station']);
  });
});
