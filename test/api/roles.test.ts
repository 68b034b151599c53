/**
 * The role matrix: every route, called by every kind of caller, answers the status the
 * role rules give. Each row states the expected status per caller.
 */
import type { WorkspaceRole } from '../../shared/schema/api';
import { chainDocumentSchema } from '../../shared/schema/chain';
import { createChain } from '../../server/chains/chain-store';
import { DataFileSchema } from '../../server/files/data-file.entity';
import { StudySchema } from '../../server/studies/study.entity';
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
  /** A finished study and a running one of the chain. */
  doneStudyId: string;
  runningStudyId: string;
}

interface Row {
  name: string;
  method: Method;
  url: (f: Fixture) => string;
  body?: (f: Fixture) => unknown;
  expect: Record<Caller, number>;
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
const adminOnly = (ok: number): Record<Caller, number> => ({
  anonymous: 401,
  viewer: 403,
  editor: 403,
  owner: 403,
  admin: ok,
  outsider: 403,
});

const ROWS: Row[] = [
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
    name: 'add member',
    method: 'post',
    url: (f) => `/api/workspaces/${f.wid}/members`,
    body: () => ({ email: 'spare@matrix.test', role: 'viewer' }),
    expect: owners(201),
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
  await createUser(em, 'spare@matrix.test');
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
  // "add member" adds the spare user: take it out again first.
  const spare = await em.findOneOrFail(UserSchema, { email: 'spare@matrix.test' });
  await em.nativeDelete(MembershipSchema, { workspace: ws.id, user: spare.id });
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
  await em.flush();
  return {
    wid: ws.id,
    chainId: chain.id,
    chainVersion: chain.version,
    targetUserId: target.id,
    fileId: file.id,
    doneStudyId: done.id,
    runningStudyId: running.id,
  };
}

describe('role matrix', () => {
  const cases = ROWS.flatMap((row) => CALLERS.map((caller) => [row.name, caller, row] as const));

  it.each(cases)(
    'should answer %s by %s with the status its role gives',
    async (_name, caller, row) => {
      const f = await freshFixture();
      const res = await send(clients[caller], row.method, row.url(f), row.body?.(f));
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
