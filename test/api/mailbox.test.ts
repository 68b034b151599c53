/**
 * The development mailbox: a site admin reads what the local mail catcher caught (both
 * parts, links absolute), and it exists only while the catcher is in use.
 */
import { createUser, createWorkspace, send, signIn, type Client } from './support/agents';
import { startCatcher } from './support/fake-smtp';
import { createTestContext, type TestContext } from './support/test-db';

const PUBLIC = 'https://bench.example.org';

describe('development mailbox with the mail catcher', () => {
  let ctx: TestContext;
  let catcher: Awaited<ReturnType<typeof startCatcher>>;
  let admin: Client;
  let owner: Client;
  let wid: string;

  beforeAll(async () => {
    catcher = await startCatcher();
    ctx = await createTestContext({ mail: catcher.mailConfig, publicUrl: PUBLIC });
    const em = ctx.services.orm.em.fork();
    await createUser(em, 'root@box.test', { displayName: 'Root', siteRole: 'admin' });
    const o = await createUser(em, 'owen@box.test', { displayName: 'Owen' });
    wid = (await createWorkspace(em, 'Mail room', [[o, 'owner']])).id;
    admin = await signIn(ctx.app, 'root@box.test');
    owner = await signIn(ctx.app, 'owen@box.test');
  });
  afterAll(async () => {
    await ctx.close();
    await catcher.stop();
  });

  it('should tell a site admin, and only an admin, that the catcher is in use', async () => {
    expect((await send(admin, 'get', '/api/me')).body.mailCatcher).toBe(true);
    expect((await send(owner, 'get', '/api/me')).body).not.toHaveProperty('mailCatcher');
  });

  it('should list caught messages and open one with its text, HTML and absolute link', async () => {
    const invited = await send(owner, 'post', `/api/workspaces/${wid}/invitations`, {
      email: 'ivy@box.test',
      role: 'viewer',
    });
    expect(invited.status).toBe(201);
    await catcher.waitFor('ivy@box.test', 'invites you');

    const list = await send(admin, 'get', '/api/admin/mailbox');
    expect(list.status).toBe(200);
    const entry = list.body.find((m: { to: string }) => m.to.includes('ivy@box.test'));
    expect(entry.subject).toBe('Owen invites you to "Mail room" on Chainwright');

    const one = await send(admin, 'get', `/api/admin/mailbox/${entry.id}`);
    expect(one.status).toBe(200);
    expect(one.body.text).toMatch(new RegExp(`${PUBLIC}/invitation/[A-Za-z0-9_-]{43}`));
    expect(one.body.html).toContain(`href="${PUBLIC}/invitation/`);

    expect((await send(owner, 'get', '/api/admin/mailbox')).status).toBe(403);
    expect((await send(admin, 'get', '/api/admin/mailbox/no-such-mail')).status).toBe(404);
    expect((await send(admin, 'get', '/api/admin/mailbox/..%2F..%2Fetc')).status).toBe(404);
  });
});

describe('development mailbox without the mail catcher', () => {
  let ctx: TestContext;
  let admin: Client;

  beforeAll(async () => {
    ctx = await createTestContext();
    await createUser(ctx.services.orm.em.fork(), 'root@nobox.test', { siteRole: 'admin' });
    admin = await signIn(ctx.app, 'root@nobox.test');
  });
  afterAll(() => ctx.close());

  it('should say there is no catcher, and the mailbox answers 404', async () => {
    expect((await send(admin, 'get', '/api/me')).body.mailCatcher).toBe(false);
    const list = await send(admin, 'get', '/api/admin/mailbox');
    expect(list.status).toBe(404);
    expect(list.body.error).toBe('no-mail-catcher');
    // The outbox (mail still to send) is there whatever the transport.
    expect((await send(admin, 'get', '/api/admin/outbox')).status).toBe(200);
  });
});
