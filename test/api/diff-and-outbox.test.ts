/** The revision diff route, and mail that fails to send: kept, told, retried, never losing the action. */
import { OutboxMessageSchema } from '../../server/mail/outbox.entity';
import { createUser, createWorkspace, send, signIn, type Client } from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { initServices } from '../../server/common/services';
import { formatEngineering } from '../../shared/units/format';
import { createTestContext, testConfig, type TestContext } from './support/test-db';

let ctx: TestContext;
let owner: Client;
let wid: string;

beforeAll(async () => {
  ctx = await createTestContext();
  const em = ctx.services.orm.em.fork();
  const o = await createUser(em, 'olive@diff.test', { displayName: 'Olive' });
  wid = (await createWorkspace(em, 'Diffs', [[o, 'owner']])).id;
  owner = await signIn(ctx.app, 'olive@diff.test');
});
afterAll(() => ctx.close());

describe('revision diff', () => {
  it('should list the changed values with units and the key figures of both revisions', async () => {
    const chainId = (
      await send(owner, 'post', `/api/workspaces/${wid}/chains`, { document: fixtureChain() })
    ).body.id;
    const next = fixtureChain();
    next.stages[1] = { ...next.stages[1], values: { l: 0.00005, c: 5.066e-10 } };
    await send(owner, 'put', `/api/chains/${chainId}`, { version: 1, document: next }).expect(200);
    const res = await send(owner, 'get', `/api/chains/${chainId}/diff?from=1&to=2`);
    expect(res.status).toBe(200);
    expect(res.body.added).toEqual([]);
    expect(res.body.values).toHaveLength(2);
    expect(res.body.values).toEqual(
      expect.arrayContaining([
        expect.objectContaining({
          stageId: 'tank',
          key: 'l',
          beforeText: '100 µH',
          afterText: '50 µH',
        }),
        expect.objectContaining({
          stageId: 'tank',
          key: 'c',
          beforeText: '253 pF',
          afterText: '507 pF',
        }),
      ]),
    );
    const gain = res.body.figures.find((f: { key: string }) => f.key === 'totalGainDb');
    expect(Number.isFinite(gain.before)).toBe(true);
    expect(Number.isFinite(gain.after)).toBe(true);
    expect((await send(owner, 'get', `/api/chains/${chainId}/diff?from=1&to=9`)).status).toBe(404);
    expect((await send(owner, 'get', `/api/chains/${chainId}/diff?from=x&to=2`)).status).toBe(422);

    // At the reader's figures: results padded to 6, stated values rounded, counts whole.
    const six = await send(owner, 'get', `/api/chains/${chainId}/diff?from=1&to=2&figures=6`);
    expect(six.status).toBe(200);
    const gain6 = six.body.figures.find((f: { key: string }) => f.key === 'totalGainDb');
    expect(gain6.afterText).toBe(formatEngineering(gain6.after, 'db', 6, true));
    expect(gain6.afterText).toMatch(/^-?\d[\d.]* dB$/);
    expect(gain6.afterText.replace(/[^\d]/g, '').replace(/^0+/, '')).toHaveLength(6);
    const c6 = six.body.values.find((v: { key: string }) => v.key === 'c');
    expect([c6.beforeText, c6.afterText]).toEqual(['253.3 pF', '506.6 pF']);
    const flags6 = six.body.figures.find((f: { key: string }) => f.key === 'flags');
    expect(flags6.afterText).toBe(String(flags6.after));
    for (const figures of ['9', '1', '2.5', 'four']) {
      const bad = await send(
        owner,
        'get',
        `/api/chains/${chainId}/diff?from=1&to=2&figures=${figures}`,
      );
      expect([figures, bad.status]).toEqual([figures, 422]);
      expect(bad.body.message).toContain('figures must be a whole number from 2 to 8');
    }
  });
});

describe('mail outbox', () => {
  it('should keep the invitation when the mail fails, say so, and send it on retry', async () => {
    const warn = jest.spyOn(console, 'warn').mockImplementation(() => undefined);
    const transport = jest
      .spyOn(ctx.services.mailer, 'sendMail')
      .mockRejectedValueOnce(new Error('connection refused') as never);
    const res = await send(owner, 'post', `/api/workspaces/${wid}/invitations`, {
      email: 'later@diff.test',
      role: 'editor',
    });
    expect(res.status).toBe(201);
    expect(res.body.mail).toMatchObject({ sent: false });
    expect(res.body.mail.message).toContain('retried automatically');
    const pending = await send(owner, 'get', `/api/workspaces/${wid}/invitations`);
    expect(pending.body.map((i: { email: string }) => i.email)).toContain('later@diff.test');
    const em = ctx.services.orm.em.fork();
    const row = await em.findOneOrFail(OutboxMessageSchema, res.body.mail.outboxId);
    expect(row).toMatchObject({ state: 'failed', attempts: 1, lastError: 'connection refused' });
    expect(row.text).toContain('/invitation/');

    // Not due yet: nothing goes. Due: it goes, and the stored body is dropped.
    expect(await ctx.services.mail.retryDue(ctx.services.em)).toBe(0);
    expect(
      await ctx.services.mail.retryDue(ctx.services.em, new Date(Date.now() + 3_600_000)),
    ).toBe(1);
    const after = await em.fork().findOneOrFail(OutboxMessageSchema, row.id);
    expect(after).toMatchObject({ state: 'sent', attempts: 2, text: null, html: null });
    expect(warn).toHaveBeenCalledTimes(1);
    transport.mockRestore();
    warn.mockRestore();
  });

  it('should send a due message once when two processes retry it at the same moment', async () => {
    const em = ctx.services.orm.em.fork();
    const row = em.create(OutboxMessageSchema, {
      recipient: 'twice@diff.test',
      subject: 'Only once',
      text: 'one copy',
      html: null,
      state: 'failed',
      attempts: 1,
      nextAttemptAt: new Date(Date.now() - 1000),
    });
    await em.flush();
    // The second "process": its own services, outbox and connections on the same schema.
    const other = await initServices(testConfig(ctx.schema));
    const delivered: string[] = [];
    const count = (mail: { to?: unknown }) => {
      delivered.push(String(mail.to));
      return Promise.resolve({}) as never;
    };
    const a = jest.spyOn(ctx.services.mailer, 'sendMail').mockImplementation(count);
    const b = jest.spyOn(other.mailer, 'sendMail').mockImplementation(count);
    try {
      const sent = await Promise.all([
        ctx.services.mail.retryDue(ctx.services.em),
        other.mail.retryDue(other.em),
        ctx.services.mail.retryDue(ctx.services.em),
      ]);
      expect(sent.reduce((x, y) => x + y, 0)).toBe(1);
      expect(delivered.filter((to) => to === 'twice@diff.test')).toHaveLength(1);
      const after = await em.fork().findOneOrFail(OutboxMessageSchema, row.id);
      expect(after).toMatchObject({ state: 'sent', attempts: 2 });
    } finally {
      a.mockRestore();
      b.mockRestore();
      await other.close();
    }
  });
});
