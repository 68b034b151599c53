/** Workspace members: adding, changing roles, removing, and the last owner's protection. */
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
  it('should add a registered user and tell them by mail', async () => {
    const res = await send(owner, 'post', `/api/workspaces/${wid}/members`, {
      email: 'Newcomer@members.test',
      role: 'editor',
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ email: 'newcomer@members.test', role: 'editor' });
    expect(sentMail).toContainEqual({
      to: 'newcomer@members.test',
      subject: 'You were added to "Members"',
    });
    const list = await send(viewer, 'get', `/api/workspaces/${wid}/members`);
    expect(list.body.map((m: { email: string }) => m.email).sort()).toEqual([
      'newcomer@members.test',
      'owner@members.test',
      'viewer@members.test',
    ]);
  });

  it('should answer 409 for someone already a member and 422 for an unknown address', async () => {
    const again = await send(owner, 'post', `/api/workspaces/${wid}/members`, {
      email: 'viewer@members.test',
      role: 'viewer',
    });
    expect(again.status).toBe(409);
    const unknown = await send(owner, 'post', `/api/workspaces/${wid}/members`, {
      email: 'ghost@members.test',
      role: 'viewer',
    });
    expect(unknown.status).toBe(422);
    expect(unknown.body.details[0].path).toBe('email');
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
    await send(viewer, 'post', `/api/workspaces/${wid}/members`, {
      email: leaver.email,
      role: 'viewer',
    }).expect(201);
    const client = await signIn(ctx.app, 'leaver@members.test');
    expect(
      (await send(client, 'delete', `/api/workspaces/${wid}/members/${leaver.id}`)).status,
    ).toBe(204);
    const after = await send(client, 'get', `/api/workspaces/${wid}/chains`);
    expect(after.status).toBe(403);
    expect(after.body.error).toBe('not-member');
  });

  it('should rename the workspace for an owner', async () => {
    const res = await send(viewer, 'patch', `/api/workspaces/${wid}`, { name: 'Members, renamed' });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ id: wid, name: 'Members, renamed', role: 'owner' });
  });
});
