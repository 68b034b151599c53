/** Comments on a chain and its stages (who may do what, mentions by mail) and the activity feed. */
import { createUser, createWorkspace, send, signIn, type Client } from './support/agents';
import { fixtureChain } from './support/chain-fixture';
import { recordMail, type SentMail } from './support/mail';
import { createTestContext, type TestContext } from './support/test-db';

let ctx: TestContext;
let owner: Client;
let editor: Client;
let viewer: Client;
let wid: string;
let chainId: string;
let sent: SentMail[];

beforeAll(async () => {
  ctx = await createTestContext();
  sent = recordMail(ctx);
  const em = ctx.services.orm.em.fork();
  const o = await createUser(em, 'oona@notes.test', { displayName: 'Oona' });
  const e = await createUser(em, 'eli@notes.test', { displayName: 'Eli' });
  const v = await createUser(em, 'vera@notes.test', { displayName: 'Vera' });
  wid = (
    await createWorkspace(em, 'Notes', [
      [o, 'owner'],
      [e, 'editor'],
      [v, 'viewer'],
    ])
  ).id;
  owner = await signIn(ctx.app, 'oona@notes.test');
  editor = await signIn(ctx.app, 'eli@notes.test');
  viewer = await signIn(ctx.app, 'vera@notes.test');
  chainId = (
    await send(editor, 'post', `/api/workspaces/${wid}/chains`, { document: fixtureChain() })
  ).body.id;
});
afterAll(() => ctx.close());

describe('comments', () => {
  it('should let a viewer comment on a stage and list it with its stage', async () => {
    const res = await send(viewer, 'post', `/api/chains/${chainId}/comments`, {
      body: 'Q looks low here',
      stageId: 'tank',
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ stageId: 'tank', author: 'Vera', body: 'Q looks low here' });
    const chainWide = await send(editor, 'post', `/api/chains/${chainId}/comments`, {
      body: 'Ready for review',
    });
    expect(chainWide.body.stageId).toBeNull();
    const list = await send(owner, 'get', `/api/chains/${chainId}/comments`);
    expect(list.body.map((c: { body: string }) => c.body)).toEqual([
      'Q looks low here',
      'Ready for review',
    ]);
  });

  it('should refuse a stage the chain does not have (422) and an empty comment', async () => {
    const res = await send(viewer, 'post', `/api/chains/${chainId}/comments`, {
      body: 'Where?',
      stageId: 'no-such-stage',
    });
    expect(res.status).toBe(422);
    expect(res.body.details[0].path).toBe('stageId');
    expect(
      (await send(viewer, 'post', `/api/chains/${chainId}/comments`, { body: '  ' })).status,
    ).toBe(422);
  });

  it('should let authors edit and delete their own, and owners delete any', async () => {
    const mine = await send(editor, 'post', `/api/chains/${chainId}/comments`, { body: 'Draft' });
    const edited = await send(editor, 'patch', `/api/chains/${chainId}/comments/${mine.body.id}`, {
      body: 'Final',
    });
    expect(edited.status).toBe(200);
    expect(edited.body.body).toBe('Final');
    expect(edited.body.editedAt).not.toBeNull();
    const byOther = await send(viewer, 'patch', `/api/chains/${chainId}/comments/${mine.body.id}`, {
      body: 'Hijacked',
    });
    expect(byOther.status).toBe(403);
    expect(
      (await send(viewer, 'delete', `/api/chains/${chainId}/comments/${mine.body.id}`)).status,
    ).toBe(403);
    expect(
      (await send(owner, 'delete', `/api/chains/${chainId}/comments/${mine.body.id}`)).status,
    ).toBe(204);
    const viewers = await send(viewer, 'post', `/api/chains/${chainId}/comments`, { body: 'Mine' });
    expect(
      (await send(viewer, 'delete', `/api/chains/${chainId}/comments/${viewers.body.id}`)).status,
    ).toBe(204);
  });

  it('should mail members mentioned by address, and no one outside the workspace', async () => {
    const res = await send(viewer, 'post', `/api/chains/${chainId}/comments`, {
      body: 'Can @eli@notes.test check the coupling? Also stranger@elsewhere.test',
      stageId: 'tank',
    });
    expect(res.body.notified).toEqual(['eli@notes.test']);
    const mail = sent.find((m) => m.to === 'eli@notes.test' && m.subject.includes('mentioned'));
    expect(mail?.subject).toBe('Vera mentioned you on "Test tank into a detector"');
    expect(mail?.text).toContain('stage "Tank"');
    expect(mail?.text).toContain(`?stage=tank`);
    expect(sent.some((m) => m.to === 'stranger@elsewhere.test')).toBe(false);
  });

  it('should keep the comment when a mention mail fails, and tell its author so', async () => {
    const warn = jest.spyOn(console, 'warn').mockImplementation(() => undefined);
    const transport = jest
      .spyOn(ctx.services.mailer, 'sendMail')
      .mockRejectedValueOnce(new Error('relay refused') as never);
    try {
      const res = await send(viewer, 'post', `/api/chains/${chainId}/comments`, {
        body: 'Over to you, oona@notes.test',
      });
      expect(res.status).toBe(201);
      expect(res.body.notified).toEqual(['oona@notes.test']);
      expect(res.body.mailProblems).toHaveLength(1);
      expect(res.body.mailProblems[0]).toContain('oona@notes.test');
      expect(res.body.mailProblems[0]).toContain('retried automatically');
      const list = await send(owner, 'get', `/api/chains/${chainId}/comments`);
      expect(list.body.map((c: { id: string }) => c.id)).toContain(res.body.id);
      expect(transport).toHaveBeenCalled();
    } finally {
      // The rejection was used up; the recording stays in place for the tests after.
      warn.mockRestore();
    }
  });
});

describe('activity', () => {
  it('should list who created, saved, commented, shared and invited, newest first, with links', async () => {
    const current = await send(editor, 'get', `/api/chains/${chainId}`);
    await send(editor, 'put', `/api/chains/${chainId}`, {
      version: current.body.version,
      document: fixtureChain({ description: 'Second cut' }),
    }).expect(200);
    await send(editor, 'post', `/api/chains/${chainId}/revisions/1/restore`, { version: 2 }).expect(
      200,
    );
    await send(editor, 'post', `/api/chains/${chainId}/share-links`, {}).expect(201);
    await send(owner, 'post', `/api/workspaces/${wid}/invitations`, {
      email: 'next@notes.test',
      role: 'viewer',
    }).expect(201);
    const feed = await send(viewer, 'get', `/api/workspaces/${wid}/activity`);
    expect(feed.status).toBe(200);
    const kinds = feed.body.map((a: { kind: string }) => a.kind);
    expect(kinds.slice(0, 4)).toEqual([
      'member-invited',
      'chain-shared',
      'chain-restored',
      'chain-saved',
    ]);
    expect(kinds).toContain('comment-added');
    expect(kinds.at(-1)).toBe('chain-created');
    const saved = feed.body.find((a: { kind: string }) => a.kind === 'chain-saved');
    expect(saved).toMatchObject({
      actor: 'Eli',
      summary: 'saved "Test tank into a detector" as version 2',
      link: `/w/${wid}/chains/${chainId}`,
    });
    const older = await send(viewer, 'get', `/api/workspaces/${wid}/activity?limit=2`);
    expect(older.body).toHaveLength(2);
    const next = await send(
      viewer,
      'get',
      `/api/workspaces/${wid}/activity?limit=2&before=${encodeURIComponent(older.body[1].createdAt)}`,
    );
    expect(next.body[0].id).not.toBe(older.body[1].id);
    expect(
      (await send(viewer, 'get', `/api/workspaces/${wid}/activity?before=yesterday`)).status,
    ).toBe(422);
  });
});
