/** Rows of the role matrix: workspaces, their members and invitations, data files and parts. */
import {
  readers,
  editors,
  owners,
  signedIn,
  everyone,
  ONE_PORT,
  PARTS_CSV,
  type Row,
} from './callers';

export const WORKSPACES_ROWS: Row[] = [
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
    name: 'workspace activity',
    method: 'get',
    url: (f) => `/api/workspaces/${f.wid}/activity`,
    expect: readers(200),
  },
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
];
