/** Rows of the role matrix: accounts, sign-in links, the site administration and the mail catcher. */
import { signedIn, everyone, adminOnly, NO_TOKEN, type Row } from './callers';

export const ACCOUNTS_ROWS: Row[] = [
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
];
