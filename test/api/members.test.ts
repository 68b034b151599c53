/** Workspace members: changing roles, removing, and the last owner's protection (also under a race). */
import { MembershipSchema } from '../../server/workspaces/membership.entity';
import { createUser, createWorkspace, send, signIn, type Client } from './support/agents';
import { createTestContext, type TestContext } from './support/test-db';

let ctx: TestContext;
let owner: Client;
let viewer: Client;
let wid: string;
let ownerId: string;
let viewerId: string;
const sentMail: { to: unknown; subject: string }[] = [];

beforeAll(async () => {
  ctx = await createTestContext();
  const em = ctx.services.orm.em.fork();
  const o = await createUser(em, 'owner@members.test', { displayName: 'Ona' });
  const v = await createUser(em, 'viewer@members.test');
  await createUser(em, 'newcomer@members.test');
  ownerId = o.id;
  viewerId = v.id;
  wid = (
    await createWorkspace(em, 'Members', [
      [o, 'owner'],
      [v, 'viewer'],
    ])
  ).id;
  owner = await signIn(ctx.app, 'owner@members.test');
  viewer = await signIn(ctx.app, 'viewer@members.test');
  const original = ctx.services.mailer.sendMail.bind(ctx.services.mailer);
  jest.spyOn(ctx.services.mailer, 'sendMail').mockImplementation(async (mail) => {
    sentMail.push({ to: mail.to, subject: String(mail.subject) });
    return original(mail);
  });
});
afterAll(() => ctx.close());

describe('members', () => {
  it('should no longer add an account by its address (invitations replace it)', async () => {
    const res = await send(owner, 'post', `/api/workspaces/${wid}/members`, {
      email: 'newcomer@members.test',
      role: 'editor',
    });
    expect(res.status).toBe(404);
    const list = await send(viewer, 'get', `/api/workspaces/${wid}/members`);
    expect(list.body.map((m: { email: string }) => m.email).sort()).toEqual([
      'owner@members.test',
      'viewer@members.test',
    ]);
    expect(sentMail).toEqual([]);
  });

  it('should refuse to demote or remove the last owner with 409', async () => {
    const demote = await send(owner, 'patch', `/api/workspaces/${wid}/members/${ownerId}`, {
      role: 'editor',
    });
    expect(demote.status).toBe(409);
    expect(demote.body.error).toBe('last-owner');
    const remove = await send(owner, 'delete', `/api/workspaces/${wid}/members/${ownerId}`);
    expect(remove.status).toBe(409);
    const list = await send(owner, 'get', `/api/workspaces/${wid}/members`);
    expect(list.body.find((m: { userId: string }) => m.userId === ownerId).role).toBe('owner');
  });

  it('should let an owner step down once there is another owner', async () => {
    await send(owner, 'patch', `/api/workspaces/${wid}/members/${viewerId}`, {
      role: 'owner',
    }).expect(200);
    const demote = await send(owner, 'patch', `/api/workspaces/${wid}/members/${ownerId}`, {
      role: 'editor',
    });
    expect(demote.status).toBe(200);
    expect(demote.body.role).toBe('editor');
  });

  it('should let a member leave, and then refuse them the workspace', async () => {
    const em = ctx.services.orm.em.fork();
    const leaver = await createUser(em, 'leaver@members.test');
    em.create(MembershipSchema, { user: leaver, workspace: wid, role: 'viewer' });
    await em.flush();
    const client = await signIn(ctx.app, 'leaver@members.test');
    expect(
      (await send(client, 'delete', `/api/workspaces/${wid}/members/${leaver.id}`)).status,
    ).toBe(204);
    const after = await send(client, 'get', `/api/workspaces/${wid}/chains`);
    expect(after.status).toBe(403);
    expect(after.body.error).toBe('not-member');
  });

  it('should leave an owner when two owners demote each other at once (50 runs)', async () => {
    const em = ctx.services.orm.em.fork();
    const a = await createUser(em, 'ann@race.test');
    const b = await createUser(em, 'bob@race.test');
    const race = await createWorkspace(em, 'Race', [
      [a, 'owner'],
      [b, 'owner'],
    ]);
    const ann = await signIn(ctx.app, 'ann@race.test');
    const bob = await signIn(ctx.app, 'bob@race.test');
    for (let run = 0; run < 50; run++) {
      await em.nativeUpdate(MembershipSchema, { workspace: race.id }, { role: 'owner' });
      const [x, y] = await Promise.all([
        send(ann, 'patch', `/api/workspaces/${race.id}/members/${b.id}`, { role: 'editor' }),
        send(bob, 'patch', `/api/workspaces/${race.id}/members/${a.id}`, { role: 'editor' }),
      ]);
      const owners = await em.fork().count(MembershipSchema, { workspace: race.id, role: 'owner' });
      expect({ run, owners }).toEqual({ run, owners: 1 });
      // One demotion went through; the other met the last-owner rule (409), or found its
      // caller already demoted (403).
      const statuses = [x.status, y.status].sort();
      expect([
        [200, 409],
        [200, 403],
      ]).toContainEqual(statuses);
    }
  }, 300_000);

  it('should rename the workspace for an owner', async () => {
    const res = await send(viewer, 'patch', `/api/workspaces/${wid}`, { name: 'Members, renamed' });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ id: wid, name: 'Members, renamed', role: 'owner' });
  });
});
