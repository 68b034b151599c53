/**
 * The signed-in user kept in memory for a moment (server/auth/user-cache.ts): it is kept,
 * and every change to an account, a membership or its sessions takes effect at once.
 */
import { RequestContext } from '@mikro-orm/core';
import { findUser, forgetCachedUsers } from '../../server/auth/user-cache';
import { UserSchema, type User } from '../../server/users/user.entity';
import { createUser, createWorkspace, PASSWORD, send, signIn, type Client } from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { createTestContext, type TestContext } from './support/test-db';

let ctx: TestContext;
let owner: Client;
let member: Client;
let memberUser: User;
let wid: string;

beforeAll(async () => {
  ctx = await createTestContext();
  const em = ctx.services.orm.em.fork();
  const o = await createUser(em, 'owner@user-cache.test');
  memberUser = await createUser(em, 'member@user-cache.test');
  wid = (
    await createWorkspace(em, 'Kept users', [
      [o, 'owner'],
      [memberUser, 'viewer'],
    ])
  ).id;
  owner = await signIn(ctx.app, 'owner@user-cache.test');
  member = await signIn(ctx.app, 'member@user-cache.test');
});
afterAll(() => ctx.close());

/** The user `id` as a request reads it, in a request context of its own. */
function readUser(id: string): Promise<User | null> {
  const { em } = ctx.services;
  return RequestContext.create(em, () => findUser(em, id));
}

/** Writes the user's display name in SQL, where the ORM (and its events) cannot see it. */
async function renameInSql(id: string, name: string): Promise<void> {
  const table = `"${ctx.schema}"."app_user"`;
  await ctx.services.em.fork().execute(`update ${table} set display_name = ? where id = ?`, [name, id]); // prettier-ignore
}

describe('the signed-in user kept in memory', () => {
  it('should answer a second read from memory, as a managed entity of the reading request', async () => {
    forgetCachedUsers();
    expect((await readUser(memberUser.id))!.displayName).toBe('member');
    await renameInSql(memberUser.id, 'Renamed in SQL');
    // Within the moment it is kept, the second read does not go to the database...
    const second = await RequestContext.create(ctx.services.em, async () => {
      const user = (await findUser(ctx.services.em, memberUser.id))!;
      const em = RequestContext.getEntityManager()!;
      const inMap: unknown = em.getUnitOfWork().getById('User', user.id);
      return { name: user.displayName, managed: inMap === user };
    });
    expect(second).toEqual({ name: 'member', managed: true });
    // ...and once forgotten, it reads the row again.
    forgetCachedUsers();
    expect((await readUser(memberUser.id))!.displayName).toBe('Renamed in SQL');
    await renameInSql(memberUser.id, 'member');
    forgetCachedUsers();
  });

  it('should see a change flushed through the ORM at once, in or out of a transaction', async () => {
    expect((await send(member, 'get', '/api/admin/users')).status).toBe(403);
    const em = ctx.services.orm.em.fork();
    const user = await em.findOneOrFail(UserSchema, { id: memberUser.id });
    user.siteRole = 'admin';
    await em.flush();
    expect((await send(member, 'get', '/api/admin/users')).status).toBe(200);
    await ctx.services.orm.em.fork().transactional(async (tem) => {
      const again = await tem.findOneOrFail(UserSchema, { id: memberUser.id });
      again.siteRole = 'user';
    });
    expect((await send(member, 'get', '/api/admin/users')).status).toBe(403);
  });

  it('should apply a workspace role change at once', async () => {
    const doc = fixtureChain();
    const save = () => send(member, 'post', `/api/workspaces/${wid}/chains`, { document: doc });
    expect((await save()).status).toBe(403);
    const promoted = await send(owner, 'patch', `/api/workspaces/${wid}/members/${memberUser.id}`, {
      role: 'editor',
    });
    expect(promoted.status).toBe(200);
    expect((await save()).status).toBe(201);
    const me = await send(member, 'get', '/api/me');
    expect(me.body.memberships).toContainEqual(expect.objectContaining({ role: 'editor' }));
    await send(owner, 'patch', `/api/workspaces/${wid}/members/${memberUser.id}`, {
      role: 'viewer',
    });
    expect((await save()).status).toBe(403);
  });

  it('should apply a password change at once: the old one fails, other sessions end', async () => {
    const other = await signIn(ctx.app, 'member@user-cache.test');
    expect((await send(other, 'get', '/api/me')).status).toBe(200);
    const newPassword = 'a-fresh-and-long-passphrase-2026';
    const changed = await send(member, 'post', '/api/auth/password', {
      currentPassword: PASSWORD,
      newPassword,
    });
    expect(changed.status).toBe(204);
    // The session that changed it checks against the new password at once.
    const again = await send(member, 'post', '/api/auth/password', {
      currentPassword: PASSWORD,
      newPassword: 'yet-another-long-passphrase-2026',
    });
    expect(again.status).toBe(422);
    expect(again.body.message).toContain('current password is wrong');
    expect((await send(other, 'get', '/api/me')).status).toBe(401);
    const back = await send(member, 'post', '/api/auth/password', {
      currentPassword: newPassword,
      newPassword: PASSWORD,
    });
    expect(back.status).toBe(204);
  });

  it('should sign a deactivated account out on its next request', async () => {
    const admin = await createUser(ctx.services.orm.em.fork(), 'admin@user-cache.test', {
      siteRole: 'admin',
    });
    const adminClient = await signIn(ctx.app, admin.email);
    expect((await send(member, 'get', '/api/me')).status).toBe(200);
    const off = await send(adminClient, 'patch', `/api/admin/users/${memberUser.id}`, {
      active: false,
    });
    expect(off.status).toBe(200);
    expect((await send(member, 'get', '/api/me')).status).toBe(401);
  });
});
