/**
 * The role matrix: every route, called by every kind of caller, answers the status the
 * role rules give. Each row states the expected status per caller.
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
import { fixtureChain } from './support/chain-fixture';
import { createTestContext, type TestContext } from './support/test-db';

type Caller = 'anonymous' | 'viewer' | 'editor' | 'owner' | 'admin' | 'outsider';
const CALLERS: Caller[] = ['anonymous', 'viewer', 'editor', 'owner', 'admin', 'outsider'];
type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** Ids a row may use; made fresh for each call so destructive routes never interfere. */
interface Fixture {
  wid: string;
  chainId: string;
  chainVersion: number;
  /** A plain member (viewer) the member routes act on. */
  targetUserId: string;
  /** A one-port data file in the workspace, used by no chain. */
  fileId: string;
  /** A capacitor in the workspace's parts bin. */
  partId: string;
  /** A finished study and a running one of the chain. */
  doneStudyId: string;
  runningStudyId: string;
  /** A pending invitation (to a fresh address) and its link's token. */
  invitationId: string;
  invitationToken: string;
  /** A live read-only link to the chain and its token. */
  shareLinkId: string;
  shareToken: string;
  /** A comment on the chain by its owner. */
  commentId: string;
}

interface Row {
  name: string;
  method: Method;
  url: (f: Fixture) => string;
  body?: (f: Fixture) => unknown;
  expect: Record<Caller, number>;
  /** An event stream: read its status and first bytes, then hang up. */
  stream?: boolean;
}

const doc = () => fixtureChain();
const BAND_SPEC = {
  kind: 'band' as const,
  gang: [{ stageId: 'tank', key: 'c', min: 100e-12, max: 400e-12 }],
  positions: 5,
  mistrackFraction: 0.5,
  points: 51,
};
const ONE_PORT = '# MHz S RI R 50\n0.5 0.2 -0.3\n2.0 0.1 -0.5\n';
const PARTS_CSV = 'Part number,Value,Q,Q at,Tolerance\nL-10U,10 uH,70,2 MHz,10\n';
const readers = (ok: number): Record<Caller, number> => ({
  anonymous: 401,
  viewer: ok,
  editor: ok,
  owner: ok,
  admin: 403,
  outsider: 403,
});
const editors = (ok: number): Record<Caller, number> => ({ ...readers(ok), viewer: 403 });
const owners = (ok: number): Record<Caller, number> => ({ ...editors(ok), editor: 403 });
const signedIn = (ok: number): Record<Caller, number> => ({
  anonymous: 401,
  viewer: ok,
  editor: ok,
  owner: ok,
  admin: ok,
  outsider: ok,
});
const everyone = (ok: number): Record<Caller, number> => ({ ...signedIn(ok), anonymous: ok });
const adminOnly = (ok: number): Record<Caller, number> => ({
  anonymous: 401,
  viewer: 403,
  editor: 403,
  owner: 403,
  admin: ok,
  outsider: 403,
});

const NO_TOKEN = 'x'.repeat(43);

const ROWS: Row[] = [
  {
    name: 'list invitations',
    method: 'get',
    url: (f) => `/api/workspaces/${f.wid}/invitations`,
    expect: owners(200),
  },
  {
    name: 'invite',
    method: 'post',
    url: (f) => `/api/workspaces/${f.wid}/invitations`,
    body: () => ({ email: 'invitee@matrix.test', role: 'editor' }),
    expect: owners(201),
  },
  {
    name: 'revoke invitation',
    method: 'delete',
    url: (f) => `/api/workspaces/${f.wid}/invitations/${f.invitationId}`,
    expect: owners(204),
  },
  {
    name: 'read invitation link',
    method: 'get',
    url: (f) => `/api/invitations/${f.invitationToken}`,
    expect: everyone(200),
  },
  {
    name: 'accept invitation',
    method: 'post',
    url: (f) => `/api/invitations/${f.invitationToken}/accept`,
    body: () => ({ displayName: 'Ivy', password: 'quiet-antenna-mast' }),
    // Signed in as someone else than the invited address: sign out first.
    expect: { ...signedIn(409), anonymous: 201 },
  },
  {
    name: 'ask for a password reset',
    method: 'post',
    url: () => '/api/auth/password-reset',
    body: () => ({ email: 'viewer@matrix.test' }),
    expect: everyone(202),
  },
  {
    name: 'reset a password (unknown link)',
    method: 'post',
    url: () => `/api/auth/password-reset/${NO_TOKEN}`,
    body: () => ({ password: 'quiet-antenna-mast' }),
    expect: everyone(404),
  },
  {
    // The answer never says whether the address has an account; the mail does.
    name: 'register (an address with an account)',
    method: 'post',
    url: () => '/api/auth/register',
    body: () => ({
      email: 'viewer@matrix.test',
      displayName: 'Again',
      password: 'quiet-antenna-mast',
    }),
    expect: everyone(202),
  },
  {
    name: 'confirm an address (unknown link)',
    method: 'post',
    url: () => `/api/auth/confirm/${NO_TOKEN}`,
    expect: everyone(404),
  },
  {
    name: 'list share links',
    method: 'get',
    url: (f) => `/api/chains/${f.chainId}/share-links`,
    expect: editors(200),
  },
  {
    name: 'create share link',
    method: 'post',
    url: (f) => `/api/chains/${f.chainId}/share-links`,
    body: () => ({ expiresInDays: 7 }),
    expect: editors(201),
  },
  {
    name: 'revoke share link',
    method: 'delete',
    url: (f) => `/api/chains/${f.chainId}/share-links/${f.shareLinkId}`,
    expect: editors(204),
  },
  {
    name: 'shared chain',
    method: 'get',
    url: (f) => `/api/shared/${f.shareToken}`,
    expect: everyone(200),
  },
  {
    name: 'shared chain catalogue',
    method: 'get',
    url: (f) => `/api/shared/${f.shareToken}/catalogue`,
    expect: everyone(200),
  },
  {
    name: 'shared chain export',
    method: 'get',
    url: (f) => `/api/shared/${f.shareToken}/export?format=json`,
    expect: everyone(200),
  },
  {
    name: 'send chain to a colleague',
    method: 'post',
    url: (f) => `/api/chains/${f.chainId}/send`,
    body: () => ({ email: 'colleague@matrix.test', note: 'Have a look at the preselector' }),
    expect: readers(202),
  },
  {
    name: 'list comments',
    method: 'get',
    url: (f) => `/api/chains/${f.chainId}/comments`,
    expect: readers(200),
  },
  {
    name: 'comment',
    method: 'post',
    url: (f) => `/api/chains/${f.chainId}/comments`,
    body: () => ({ body: 'Is the coupling too tight here?' }),
    expect: readers(201),
  },
  {
    name: "edit the owner's comment",
    method: 'patch',
    url: (f) => `/api/chains/${f.chainId}/comments/${f.commentId}`,
    body: () => ({ body: 'Edited' }),
    // Only its author (the owner) edits it.
    expect: { ...owners(200), editor: 403, viewer: 403 },
  },
  {
    name: "delete the owner's comment",
    method: 'delete',
    url: (f) => `/api/chains/${f.chainId}/comments/${f.commentId}`,
    expect: { ...owners(204), editor: 403, viewer: 403 },
  },
  {
    name: 'workspace activity',
    method: 'get',
    url: (f) => `/api/workspaces/${f.wid}/activity`,
    expect: readers(200),
  },
  {
    name: 'revision diff',
    method: 'get',
    url: (f) => `/api/chains/${f.chainId}/diff?from=1&to=1`,
    expect: readers(200),
  },
  {
    name: 'chain events (presence)',
    method: 'get',
    url: (f) => `/api/chains/${f.chainId}/events`,
    expect: readers(200),
    stream: true,
  },
  {
    name: 'mail catcher messages',
    method: 'get',
    url: () => '/api/admin/mailbox',
    // These tests send through a JSON transport: there is no catcher to read.
    expect: adminOnly(404),
  },
  {
    name: 'mail catcher message',
    method: 'get',
    url: () => '/api/admin/mailbox/2026-01-01T00-00-00-000Z-1',
    expect: adminOnly(404),
  },
  { name: 'mail outbox', method: 'get', url: () => '/api/admin/outbox', expect: adminOnly(200) },
  {
    name: 'retry outbox message (none)',
    method: 'post',
    url: () => '/api/admin/outbox/7d0c2a39-3e43-4c55-9f4c-3d1f2f6f0b11/retry',
    expect: adminOnly(404),
  },
  {
    name: 'health',
    method: 'get',
    url: () => '/api/health',
    expect: { ...signedIn(200), anonymous: 200 },
  },
  {
    name: 'CSRF token',
    method: 'get',
    url: () => '/api/auth/csrf',
    expect: { ...signedIn(200), anonymous: 200 },
  },
  {
    name: 'registration status',
    method: 'get',
    url: () => '/api/auth/registration',
    expect: { ...signedIn(200), anonymous: 200 },
  },
  { name: 'me', method: 'get', url: () => '/api/me', expect: signedIn(200) },
  { name: 'list workspaces', method: 'get', url: () => '/api/workspaces', expect: signedIn(200) },
  {
    name: 'create workspace',
    method: 'post',
    url: () => '/api/workspaces',
    body: () => ({ name: 'New team' }),
    expect: signedIn(201),
  },
  {
    name: 'rename workspace',
    method: 'patch',
    url: (f) => `/api/workspaces/${f.wid}`,
    body: () => ({ name: 'Renamed' }),
    expect: owners(200),
  },
  {
    name: 'list members',
    method: 'get',
    url: (f) => `/api/workspaces/${f.wid}/members`,
    expect: readers(200),
  },
  {
    name: 'change member role',
    method: 'patch',
    url: (f) => `/api/workspaces/${f.wid}/members/${f.targetUserId}`,
    body: () => ({ role: 'editor' }),
    expect: owners(200),
  },
  {
    name: 'remove member',
    method: 'delete',
    url: (f) => `/api/workspaces/${f.wid}/members/${f.targetUserId}`,
    // A viewer may remove only themselves; the target is another viewer.
    expect: owners(204),
  },
  {
    name: 'list chains',
    method: 'get',
    url: (f) => `/api/workspaces/${f.wid}/chains`,
    expect: readers(200),
  },
  {
    name: 'create chain',
    method: 'post',
    url: (f) => `/api/workspaces/${f.wid}/chains`,
    body: () => ({ document: doc() }),
    expect: editors(201),
  },
  {
    name: 'import chain file',
    method: 'post',
    url: (f) => `/api/workspaces/${f.wid}/chains/import`,
    body: () => ({ text: JSON.stringify(doc()), fileName: 'imported.chain.json' }),
    expect: editors(201),
  },
  {
    name: 'create chain from example',
    method: 'post',
    url: (f) => `/api/workspaces/${f.wid}/chains`,
    body: () => ({ fromExample: 'test-tank' }),
    expect: editors(201),
  },
  {
    name: 'read chain',
    method: 'get',
    url: (f) => `/api/chains/${f.chainId}`,
    expect: readers(200),
  },
  {
    name: 'update chain',
    method: 'put',
    url: (f) => `/api/chains/${f.chainId}`,
    body: (f) => ({ version: f.chainVersion, document: doc() }),
    expect: editors(200),
  },
  {
    name: 'delete chain',
    method: 'delete',
    url: (f) => `/api/chains/${f.chainId}`,
    expect: editors(204),
  },
  {
    name: 'duplicate chain',
    method: 'post',
    url: (f) => `/api/chains/${f.chainId}/duplicate`,
    body: () => ({ asVariant: true }),
    expect: editors(201),
  },
  {
    name: 'chain family',
    method: 'get',
    url: (f) => `/api/chains/${f.chainId}/family`,
    expect: readers(200),
  },
  {
    name: 'list revisions',
    method: 'get',
    url: (f) => `/api/chains/${f.chainId}/revisions`,
    expect: readers(200),
  },
  {
    name: 'read revision',
    method: 'get',
    url: (f) => `/api/chains/${f.chainId}/revisions/1`,
    expect: readers(200),
  },
  {
    name: 'restore revision',
    method: 'post',
    url: (f) => `/api/chains/${f.chainId}/revisions/1/restore`,
    body: (f) => ({ version: f.chainVersion }),
    expect: editors(200),
  },
  { name: 'examples', method: 'get', url: () => '/api/examples', expect: signedIn(200) },
  { name: 'admin users', method: 'get', url: () => '/api/admin/users', expect: adminOnly(200) },
  {
    name: 'admin settings',
    method: 'get',
    url: () => '/api/admin/settings',
    expect: adminOnly(200),
  },
  {
    name: 'change admin settings',
    method: 'patch',
    url: () => '/api/admin/settings',
    body: () => ({ openRegistration: true }),
    expect: adminOnly(200),
  },
  {
    name: 'admin deactivate account',
    method: 'patch',
    url: (f) => `/api/admin/users/${f.targetUserId}`,
    body: () => ({ active: false }),
    expect: adminOnly(200),
  },
  {
    name: 'admin delete account',
    method: 'delete',
    url: (f) => `/api/admin/users/${f.targetUserId}`,
    expect: adminOnly(200),
  },
  {
    name: 'change password (wrong current one)',
    method: 'post',
    url: () => '/api/auth/password',
    body: () => ({ currentPassword: 'not-the-password', newPassword: 'another-long-one' }),
    expect: signedIn(422),
  },
  {
    name: 'chain analysis',
    method: 'get',
    url: (f) => `/api/chains/${f.chainId}/analysis?sweep=1`,
    expect: readers(200),
  },
  {
    name: 'chain analysis of every mode',
    method: 'get',
    url: (f) => `/api/chains/${f.chainId}/analysis?modes=all`,
    expect: readers(200),
  },
  {
    name: 'analysis',
    method: 'post',
    url: () => '/api/analysis',
    body: () => ({ document: doc(), sweep: false }),
    expect: signedIn(200),
  },
  { name: 'catalogue', method: 'get', url: () => '/api/catalogue', expect: signedIn(200) },
  {
    name: 'design: tune candidates',
    method: 'post',
    url: () => '/api/design/tune/candidates',
    body: () => ({ document: doc(), resonator: { stageId: 'tank', label: 'tank' } }),
    expect: signedIn(200),
  },
  {
    name: 'design: tune',
    method: 'post',
    url: () => '/api/design/tune',
    body: (f) => ({
      document: doc(),
      workspaceId: f.wid,
      resonator: { stageId: 'tank', label: 'tank' },
      element: { stageId: 'tank', key: 'c' },
      targetHz: 1e6,
    }),
    expect: readers(200),
  },
  {
    name: 'design: tune the pair (not a pair: 422)',
    method: 'post',
    url: () => '/api/design/tune-pair',
    body: () => ({ document: doc(), stageId: 'tank', targetHz: 1e6, bandwidthHz: 2e4 }),
    expect: signedIn(422),
  },
  {
    name: 'design: match here',
    method: 'post',
    url: () => '/api/design/match-here',
    body: () => ({ document: doc(), afterStageId: 'src' }),
    expect: signedIn(200),
  },
  {
    name: 'design: snap',
    method: 'post',
    url: () => '/api/design/snap',
    body: () => ({ document: doc(), series: 'E12' }),
    expect: signedIn(200),
  },
  {
    name: 'design: parts',
    method: 'post',
    url: () => '/api/design/parts',
    body: () => ({ document: doc(), stageId: 'tank' }),
    expect: signedIn(200),
  },
  {
    name: 'list studies',
    method: 'get',
    url: (f) => `/api/chains/${f.chainId}/studies`,
    expect: readers(200),
  },
  {
    name: 'start a study',
    method: 'post',
    url: (f) => `/api/chains/${f.chainId}/studies`,
    body: () => BAND_SPEC,
    expect: editors(202),
  },
  {
    name: 'read a study',
    method: 'get',
    url: (f) => `/api/chains/${f.chainId}/studies/${f.doneStudyId}`,
    expect: readers(200),
  },
  {
    name: 'study progress events',
    method: 'get',
    url: (f) => `/api/chains/${f.chainId}/studies/${f.doneStudyId}/events`,
    expect: readers(200),
  },
  {
    name: 'cancel a study',
    method: 'post',
    url: (f) => `/api/chains/${f.chainId}/studies/${f.runningStudyId}/cancel`,
    expect: editors(202),
  },
  {
    name: 'chain export',
    method: 'get',
    url: (f) => `/api/chains/${f.chainId}/export?format=spice`,
    expect: readers(200),
  },
  {
    name: 'analysis with workspace files',
    method: 'post',
    url: () => '/api/analysis',
    body: (f) => ({ document: doc(), sweep: false, workspaceId: f.wid }),
    expect: readers(200),
  },
  {
    name: 'list data files',
    method: 'get',
    url: (f) => `/api/workspaces/${f.wid}/files`,
    expect: readers(200),
  },
  {
    name: 'upload data file',
    method: 'post',
    url: (f) => `/api/workspaces/${f.wid}/files`,
    body: () => ({ name: 'matrix.s1p', content: ONE_PORT }),
    expect: editors(201),
  },
  {
    name: 'read data file',
    method: 'get',
    url: (f) => `/api/workspaces/${f.wid}/files/${f.fileId}`,
    expect: readers(200),
  },
  {
    name: 'delete data file',
    method: 'delete',
    url: (f) => `/api/workspaces/${f.wid}/files/${f.fileId}`,
    expect: editors(204),
  },
  {
    name: 'list parts',
    method: 'get',
    url: (f) => `/api/workspaces/${f.wid}/parts`,
    expect: readers(200),
  },
  {
    name: 'preview parts list',
    method: 'post',
    url: (f) => `/api/workspaces/${f.wid}/parts/preview`,
    body: () => ({ text: PARTS_CSV }),
    expect: editors(200),
  },
  {
    name: 'import parts list',
    method: 'post',
    url: (f) => `/api/workspaces/${f.wid}/parts/import`,
    body: () => ({ text: PARTS_CSV }),
    expect: editors(201),
  },
  {
    name: 'delete part',
    method: 'delete',
    url: (f) => `/api/workspaces/${f.wid}/parts/${f.partId}`,
    expect: editors(204),
  },
  {
    name: 'export',
    method: 'post',
    url: () => '/api/export',
    body: () => ({ document: doc(), format: 'touchstone', z0: 75 }),
    expect: signedIn(200),
  },
];

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
