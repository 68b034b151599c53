/**
 * Invitations end to end through the local mail catcher (a real SMTP conversation), and
 * password resets: single use, expiry, and other sessions ended.
 */
import { PasswordResetSchema } from '../../server/auth/account-token.entity';
import { InvitationSchema } from '../../server/workspaces/invitation.entity';
import { newToken } from '../../server/auth/tokens';
import { UserSchema, type User } from '../../server/users/user.entity';
import {
  anonymous,
  createUser,
  createWorkspace,
  PASSWORD,
  send,
  signIn,
  type Client,
} from './support/agents';
import { startCatcher } from './support/fake-smtp';
import { linkFrom } from './support/mail';
import { createTestContext, type TestContext } from './support/test-db';

let ctx: TestContext;
let catcher: Awaited<ReturnType<typeof startCatcher>>;
let owner: Client;
let wid: string;
const PUBLIC = 'https://chainwright.example.org';

beforeAll(async () => {
  catcher = await startCatcher();
  ctx = await createTestContext({ mail: catcher.mailConfig, publicUrl: PUBLIC });
  const em = ctx.services.orm.em.fork();
  const o = await createUser(em, 'olga@invite.test', { displayName: 'Olga' });
  await createUser(em, 'known@invite.test', { displayName: 'Known' });
  wid = (await createWorkspace(em, 'Front ends', [[o, 'owner']])).id;
  owner = await signIn(ctx.app, 'olga@invite.test');
});
afterAll(async () => {
  await ctx.close();
  await catcher.stop();
});

describe('invitations', () => {
  it('should mail a link that signs a new person up with the invited role, once', async () => {
    const res = await send(owner, 'post', `/api/workspaces/${wid}/invitations`, {
      email: 'New.Person@invite.test',
      role: 'editor',
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ email: 'new.person@invite.test', role: 'editor' });
    expect(res.body.mail.sent).toBe(true);
    const days = (Date.parse(res.body.expiresAt) - Date.now()) / 86_400_000;
    expect(days).toBeGreaterThan(6.9);
    expect(days).toBeLessThanOrEqual(7);

    const mail = await catcher.waitFor('new.person@invite.test', 'invites you to "Front ends"');
    // Plain text and HTML, both with the absolute link from the public address.
    expect(mail.text).toContain(`${PUBLIC}/invitation/`);
    expect(mail.html).toContain(`href="${PUBLIC}/invitation/`);
    const token = linkFrom(mail.text, '/invitation/');

    const stranger = await anonymous(ctx.app);
    const preview = await stranger.agent.get(`/api/invitations/${token}`);
    expect(preview.body).toMatchObject({
      workspaceName: 'Front ends',
      role: 'editor',
      invitedBy: 'Olga',
      hasAccount: false,
    });
    const weak = await send(stranger, 'post', `/api/invitations/${token}/accept`, {
      displayName: 'Nell',
      password: 'password1234',
    });
    expect(weak.status).toBe(422);
    const accepted = await send(stranger, 'post', `/api/invitations/${token}/accept`, {
      displayName: 'Nell',
      password: 'quiet-antenna-mast',
    });
    expect(accepted.status).toBe(201);
    expect(accepted.body).toMatchObject({ workspaceId: wid, role: 'editor' });
    const nell = { agent: stranger.agent, csrf: accepted.body.csrfToken };
    const me = await send(nell, 'get', '/api/me');
    expect(me.body.memberships).toEqual([
      { workspaceId: wid, workspaceName: 'Front ends', role: 'editor' },
    ]);

    // A second use fails, signed in or not.
    const again = await anonymous(ctx.app);
    const second = await send(again, 'post', `/api/invitations/${token}/accept`, {
      displayName: 'Nell again',
      password: 'quiet-antenna-mast',
    });
    expect(second.status).toBe(410);
    expect(second.body.message).toContain('accepted already');
  });

  it('should ask an existing account for its password, not a new one', async () => {
    const res = await send(owner, 'post', `/api/workspaces/${wid}/invitations`, {
      email: 'known@invite.test',
      role: 'viewer',
    });
    const token = linkFrom(
      (await catcher.waitFor('known@invite.test', 'invites you')).text,
      '/invitation/',
    );
    expect(res.status).toBe(201);
    const visitor = await anonymous(ctx.app);
    expect((await visitor.agent.get(`/api/invitations/${token}`)).body.hasAccount).toBe(true);
    const wrong = await send(visitor, 'post', `/api/invitations/${token}/accept`, {
      password: 'not-the-password',
    });
    expect(wrong.status).toBe(422);
    const ok = await send(visitor, 'post', `/api/invitations/${token}/accept`, {
      password: 'correct-horse-battery',
    });
    expect(ok.status).toBe(200);
    expect(ok.body).toMatchObject({ role: 'viewer', user: { email: 'known@invite.test' } });
  });

  it('should list pending invitations to owners and revoke one with immediate effect', async () => {
    await send(owner, 'post', `/api/workspaces/${wid}/invitations`, {
      email: 'later@invite.test',
      role: 'viewer',
    }).expect(201);
    const token = linkFrom(
      (await catcher.waitFor('later@invite.test', 'invites you')).text,
      '/invitation/',
    );
    const pending = await send(owner, 'get', `/api/workspaces/${wid}/invitations`);
    const entry = pending.body.find((i: { email: string }) => i.email === 'later@invite.test');
    expect(entry).toMatchObject({ role: 'viewer', invitedBy: 'Olga' });
    expect(pending.body.map((i: { email: string }) => i.email)).not.toContain(
      'new.person@invite.test',
    );
    await send(owner, 'delete', `/api/workspaces/${wid}/invitations/${entry.id}`).expect(204);
    const visitor = await anonymous(ctx.app);
    const res = await visitor.agent.get(`/api/invitations/${token}`);
    expect(res.status).toBe(410);
    expect(res.body.message).toContain('withdrawn');
    expect(
      (await send(owner, 'delete', `/api/workspaces/${wid}/invitations/${entry.id}`)).status,
    ).toBe(404);
  });

  it('should not sign a deactivated account in, even with its password', async () => {
    const em = ctx.services.orm.em.fork();
    const gone = await createUser(em, 'gone@invite.test');
    gone.deactivatedAt = new Date();
    await em.flush();
    const olga = await em.findOneOrFail(UserSchema, { email: 'olga@invite.test' });
    const token = await inviteDirectly(ctx, wid, olga, 'gone@invite.test');
    const visitor = await anonymous(ctx.app);
    const res = await send(visitor, 'post', `/api/invitations/${token}/accept`, {
      password: PASSWORD,
    });
    expect(res.status).toBe(403);
    expect(res.body.error).toBe('account-deactivated');
    expect((await visitor.agent.get('/api/me')).status).toBe(401);
  });

  it('should refuse an expired link and an invitation of a member', async () => {
    await send(owner, 'post', `/api/workspaces/${wid}/invitations`, {
      email: 'slow@invite.test',
      role: 'viewer',
    }).expect(201);
    const token = linkFrom(
      (await catcher.waitFor('slow@invite.test', 'invites you')).text,
      '/invitation/',
    );
    const em = ctx.services.orm.em.fork();
    await em.nativeUpdate(
      InvitationSchema,
      { email: 'slow@invite.test' },
      { expiresAt: new Date(Date.now() - 1000) },
    );
    const res = await (await anonymous(ctx.app)).agent.get(`/api/invitations/${token}`);
    expect(res.status).toBe(410);
    expect(res.body.message).toContain('expired');
    const member = await send(owner, 'post', `/api/workspaces/${wid}/invitations`, {
      email: 'olga@invite.test',
      role: 'viewer',
    });
    expect(member.status).toBe(409);
    expect(
      (await (await anonymous(ctx.app)).agent.get('/api/invitations/not-a-token')).status,
    ).toBe(404);
  });
});

/** An invitation made in the database (no mail); returns its link's token. */
async function inviteDirectly(
  context: TestContext,
  workspaceId: string,
  by: User,
  email: string,
): Promise<string> {
  const em = context.services.orm.em.fork();
  const { token, hash } = newToken();
  em.create(InvitationSchema, {
    workspace: workspaceId,
    email,
    role: 'viewer',
    tokenHash: hash,
    invitedBy: by.id,
    expiresAt: new Date(Date.now() + 86_400_000),
  });
  await em.flush();
  return token;
}

describe('accepting into an existing account', () => {
  let limited: TestContext;
  let inviter: User;
  let wsId: string;

  beforeAll(async () => {
    limited = await createTestContext({ signInLimit: { windowMs: 60_000, limit: 3 } });
    const em = limited.services.orm.em.fork();
    inviter = await createUser(em, 'ida@limit.test', { displayName: 'Ida' });
    await createUser(em, 'kim@limit.test');
    wsId = (await createWorkspace(em, 'Limits', [[inviter, 'owner']])).id;
  });
  afterAll(() => limited.close());

  it('should count wrong passwords against the sign-in limit', async () => {
    const token = await inviteDirectly(limited, wsId, inviter, 'kim@limit.test');
    const visitor = await anonymous(limited.app);
    const guess = () =>
      send(visitor, 'post', `/api/invitations/${token}/accept`, { password: 'a-wrong-guess' });
    for (let i = 0; i < 3; i++) expect((await guess()).status).toBe(422);
    const blocked = await guess();
    expect(blocked.status).toBe(429);
    expect(blocked.body.error).toBe('too-many-attempts');
  });
});

describe('password reset', () => {
  it('should answer 202 alike for known and unknown addresses', async () => {
    const visitor = await anonymous(ctx.app);
    const known = await send(visitor, 'post', '/api/auth/password-reset', {
      email: 'known@invite.test',
    });
    const unknown = await send(visitor, 'post', '/api/auth/password-reset', {
      email: 'nobody@invite.test',
    });
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(unknown.body.message.replace('nobody', 'known')).toBe(known.body.message);
    await catcher.waitFor('known@invite.test', 'Choose a new Chainwright password');
  });

  it('should reset by the mailed link once, ending every session of the account', async () => {
    const em = ctx.services.orm.em.fork();
    await createUser(em, 'rita@invite.test');
    const laptop = await signIn(ctx.app, 'rita@invite.test');
    const phone = await signIn(ctx.app, 'rita@invite.test');
    const visitor = await anonymous(ctx.app);
    await send(visitor, 'post', '/api/auth/password-reset', { email: 'rita@invite.test' }).expect(
      202,
    );
    const mail = await catcher.waitFor('rita@invite.test', 'Choose a new Chainwright password');
    expect(mail.html).toContain(`${PUBLIC}/reset-password/`);
    const token = linkFrom(mail.text, '/reset-password/');
    const row = await em.findOneOrFail(PasswordResetSchema, {
      user: { email: 'rita@invite.test' },
    });
    const minutes = (row.expiresAt.getTime() - Date.now()) / 60_000;
    expect(minutes).toBeGreaterThan(58);
    expect(minutes).toBeLessThanOrEqual(60);

    const reset = await send(visitor, 'post', `/api/auth/password-reset/${token}`, {
      password: 'fresh-ferrite-core',
    });
    expect(reset.status).toBe(204);
    expect((await laptop.agent.get('/api/me')).status).toBe(401);
    expect((await phone.agent.get('/api/me')).status).toBe(401);
    await expect(signIn(ctx.app, 'rita@invite.test')).rejects.toThrow('401');
    await expect(signIn(ctx.app, 'rita@invite.test', 'fresh-ferrite-core')).resolves.toBeDefined();
    const twice = await send(visitor, 'post', `/api/auth/password-reset/${token}`, {
      password: 'another-ferrite-core',
    });
    expect(twice.status).toBe(404);
  });

  it('should refuse an expired link', async () => {
    const em = ctx.services.orm.em.fork();
    await createUser(em, 'tom@invite.test');
    const visitor = await anonymous(ctx.app);
    await send(visitor, 'post', '/api/auth/password-reset', { email: 'tom@invite.test' }).expect(
      202,
    );
    const token = linkFrom(
      (await catcher.waitFor('tom@invite.test', 'new Chainwright password')).text,
      '/reset-password/',
    );
    await em.nativeUpdate(
      PasswordResetSchema,
      { user: { email: 'tom@invite.test' } },
      { expiresAt: new Date(Date.now() - 1) },
    );
    const res = await send(visitor, 'post', `/api/auth/password-reset/${token}`, {
      password: 'fresh-ferrite-core',
    });
    expect(res.status).toBe(404);
    expect(res.body.message).toContain('expired');
  });
});
