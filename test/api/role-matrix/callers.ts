/**
 * The callers of the role matrix (test/api/roles.test.ts), the statuses each kind of route
 * gives them, and the ids and bodies its rows use.
 */
import { fixtureChain } from '../support/chain-fixture';

export type Caller = 'anonymous' | 'viewer' | 'editor' | 'owner' | 'admin' | 'outsider';
export const CALLERS: Caller[] = ['anonymous', 'viewer', 'editor', 'owner', 'admin', 'outsider'];
export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** Ids a row may use; made fresh for each call so destructive routes never interfere. */
export interface Fixture {
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

export interface Row {
  name: string;
  method: Method;
  url: (f: Fixture) => string;
  body?: (f: Fixture) => unknown;
  expect: Record<Caller, number>;
  /** An event stream: read its status and first bytes, then hang up. */
  stream?: boolean;
}

export const doc = () => fixtureChain();
export const BAND_SPEC = {
  kind: 'band' as const,
  gang: [{ stageId: 'tank', key: 'c', min: 100e-12, max: 400e-12 }],
  positions: 5,
  mistrackFraction: 0.5,
  points: 51,
};
export const ONE_PORT = '# MHz S RI R 50\n0.5 0.2 -0.3\n2.0 0.1 -0.5\n';
export const PARTS_CSV = 'Part number,Value,Q,Q at,Tolerance\nL-10U,10 uH,70,2 MHz,10\n';
export const readers = (ok: number): Record<Caller, number> => ({
  anonymous: 401,
  viewer: ok,
  editor: ok,
  owner: ok,
  admin: 403,
  outsider: 403,
});
export const editors = (ok: number): Record<Caller, number> => ({ ...readers(ok), viewer: 403 });
export const owners = (ok: number): Record<Caller, number> => ({ ...editors(ok), editor: 403 });
export const signedIn = (ok: number): Record<Caller, number> => ({
  anonymous: 401,
  viewer: ok,
  editor: ok,
  owner: ok,
  admin: ok,
  outsider: ok,
});
export const everyone = (ok: number): Record<Caller, number> => ({
  ...signedIn(ok),
  anonymous: ok,
});
export const adminOnly = (ok: number): Record<Caller, number> => ({
  anonymous: 401,
  viewer: 403,
  editor: 403,
  owner: 403,
  admin: ok,
  outsider: 403,
});

export const NO_TOKEN = 'x'.repeat(43);
