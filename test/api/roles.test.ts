/**
 * The role matrix: every route, called by every kind of caller, answers the status the
 * role rules give. The rows, one a route with the expected status per caller, are kept by
 * subject in role-matrix/; this file makes the callers and a fresh fixture for each call.
 */
import type { WorkspaceRole } from '../../shared/schema/api';
import { chainDocumentSchema } from '../../shared/schema/chain';
import { createChain } from '../../server/chains/chain-store';
import { newToken } from '../../server/auth/tokens';
import { CommentSchema } from '../../server/comments/comment.entity';
import { DataFileSchema } from '../../server/files/data-file.entity';
import { PartSchema } from '../../server/parts/part.entity';
import { StudySchema } from '../../server/studies/study.entity';
import { ShareLinkSchema } from '../../server/sharing/share-link.entity';
import { InvitationSchema } from '../../server/workspaces/invitation.entity';
import { UserSchema, type User } from '../../server/users/user.entity';
import { MembershipSchema } from '../../server/workspaces/membership.entity';
import { WorkspaceSchema, type Workspace } from '../../server/workspaces/workspace.entity';
import {
  anonymous,
  createUser,
  createWorkspace,
  send,
  signIn,
  type Client,
} from './support/agents';
import { createTestContext, type TestContext } from './support/test-db';
import {
  CALLERS,
  BAND_SPEC,
  ONE_PORT,
  doc,
  type Caller,
  type Fixture,
  type Row,
} from './role-matrix/callers';
import { ACCOUNTS_ROWS } from './role-matrix/accounts';
import { ANALYSIS_ROWS } from './role-matrix/analysis';
import { CHAINS_ROWS } from './role-matrix/chains';
import { WORKSPACES_ROWS } from './role-matrix/workspaces';

/** Every route, by subject; each row states the expected status per caller. */
const ROWS: Row[] = [...ACCOUNTS_ROWS, ...WORKSPACES_ROWS, ...CHAINS_ROWS, ...ANALYSIS_ROWS];

// Calls sign in (scrypt) and analyse: give them room on a busy shared machine.
jest.setTimeout(30_000);

let ctx: TestContext;
let clients: Record<Caller, Client>;
let users: Record<Exclude<Caller, 'anonymous'>, User>;
let workspace: Workspace;

beforeAll(async () => {
  ctx = await createTestContext();
  const em = ctx.services.orm.em.fork();
  users = {
    viewer: await createUser(em, 'viewer@matrix.test'),
    editor: await createUser(em, 'editor@matrix.test'),
    owner: await createUser(em, 'owner@matrix.test'),
    admin: await createUser(em, 'admin@matrix.test', { siteRole: 'admin' }),
    outsider: await createUser(em, 'outsider@matrix.test'),
  };
  const roles: [User, WorkspaceRole][] = [
    [users.viewer, 'viewer'],
    [users.editor, 'editor'],
    [users.owner, 'owner'],
  ];
  workspace = await createWorkspace(em, 'Matrix', roles);
  clients = { anonymous: await anonymous(ctx.app) } as Record<Caller, Client>;
  for (const caller of CALLERS.filter((c) => c !== 'anonymous')) {
    clients[caller] = await signIn(ctx.app, `${caller}@matrix.test`);
  }
  // Six scrypt hashes and sign-ins: slow on a busy shared machine.
}, 60_000);

afterAll(() => ctx.close());

/** A fresh chain and target member for one call. */
async function freshFixture(): Promise<Fixture> {
  const em = ctx.services.orm.em.fork();
  const ws = await em.findOneOrFail(WorkspaceSchema, workspace.id);
  const owner = await em.findOneOrFail(UserSchema, users.owner.id);
  const chain = await createChain(em, {
    workspace: ws,
    document: chainDocumentSchema.parse(doc()),
    user: owner,
    message: 'matrix',
  });
  const target = await createUser(em, `target-${chain.id.slice(0, 8)}@matrix.test`);
  em.create(MembershipSchema, { user: target, workspace: ws, role: 'viewer' });
  const file = em.create(DataFileSchema, {
    workspace: ws,
    name: 'matrix.s1p',
    kind: 's1p',
    content: ONE_PORT,
    portCount: 1,
    pointCount: 2,
    fMinHz: 0.5e6,
    fMaxHz: 2e6,
    uploadedBy: owner,
  });
  const part = em.create(PartSchema, {
    workspace: ws,
    partNumber: 'C-100P',
    kind: 'capacitor',
    value: 100e-12,
    q: 500,
    qFreqHz: 10e6,
    tolerancePct: 5,
    notes: '',
    sourceLine: 2,
    uploadedBy: owner,
  });
  const study = (status: 'done' | 'running') =>
    em.create(StudySchema, {
      chain,
      chainVersion: chain.version,
      // Not a caller: the callers' own running studies count against their limit.
      createdBy: target,
      kind: 'band',
      status,
      spec: BAND_SPEC,
      document: chain.document,
      result: status === 'done' ? { positions: [] } : null,
    });
  const done = study('done');
  const running = study('running');
  const invite = newToken();
  const invitation = em.create(InvitationSchema, {
    workspace: ws,
    email: `invited-${chain.id.slice(0, 8)}@matrix.test`,
    role: 'viewer',
    tokenHash: invite.hash,
    invitedBy: owner,
    expiresAt: new Date(Date.now() + 86_400_000),
  });
  const share = newToken();
  const link = em.create(ShareLinkSchema, {
    chain,
    tokenHash: share.hash,
    createdBy: owner,
    expiresAt: null,
  });
  const comment = em.create(CommentSchema, { chain, author: owner, body: 'Owner note' });
  await em.flush();
  return {
    wid: ws.id,
    chainId: chain.id,
    chainVersion: chain.version,
    targetUserId: target.id,
    fileId: file.id,
    partId: part.id,
    doneStudyId: done.id,
    runningStudyId: running.id,
    invitationId: invitation.id,
    invitationToken: invite.token,
    shareLinkId: link.id,
    shareToken: share.token,
    commentId: comment.id,
  };
}

/** Status and body of an event stream's start, then hangs up (the stream never ends). */
function openStream(client: Client, url: string): Promise<{ status: number; body: unknown }> {
  return new Promise((resolve, reject) => {
    const req = client.agent
      .get(url)
      .buffer(true)
      .parse((res, done) => {
        let text = '';
        res.on('data', (chunk: Buffer) => {
          text += chunk.toString('utf8');
          if (res.statusCode === 200 && text.includes('event: presence')) {
            (res as unknown as { destroy(): void }).destroy();
            done(null, text);
          }
        });
        res.on('end', () => done(null, text ? JSON.parse(text) : {}));
      });
    req.then(
      (res) => resolve({ status: res.status, body: res.body }),
      (err: { response?: { status: number; body: unknown } }) =>
        err.response ? resolve(err.response) : reject(err as Error),
    );
  });
}

describe('role matrix', () => {
  const cases = ROWS.flatMap((row) => CALLERS.map((caller) => [row.name, caller, row] as const));

  it.each(cases)(
    'should answer %s by %s with the status its role gives',
    async (_name, caller, row) => {
      const f = await freshFixture();
      // A fresh visitor each time: accepting an invitation signs the visitor in.
      const client = caller === 'anonymous' ? await anonymous(ctx.app) : clients[caller];
      const res = row.stream
        ? await openStream(client, row.url(f))
        : await send(client, row.method, row.url(f), row.body?.(f));
      expect(res.status).toBe(row.expect[caller]);
      // Every refusal says why, as JSON.
      const refusal = expect.objectContaining({
        error: expect.any(String),
        message: expect.any(String),
      });
      expect(res.status < 400 ? 'success' : res.body).toEqual(
        res.status < 400 ? 'success' : refusal,
      );
    },
  );
});
