/**
 * Site administration of accounts: the demo admin deactivates a fresh account (which then
 * cannot sign in), reactivates it, and deletes it after confirming.
 */
import type { Browser, Page } from 'playwright-core';
import {
  BASE_URL,
  DEMO,
  launchBrowser,
  openPage,
  shot,
  signIn,
  uniqueSuffix,
  type WatchedPage,
} from './harness';
import { mailedLink } from './mail';

/**
 * Registers an account through the API (registration is open in the demo data) and
 * confirms the address from the mailed link, as the account exists only once confirmed.
 */
async function registerThroughApi(email: string, displayName: string, password: string) {
  const csrf = await fetch(`${BASE_URL}/api/auth/csrf`);
  const cookie = (csrf.headers.get('set-cookie') ?? '').split(';')[0];
  const { token } = (await csrf.json()) as { token: string };
  const headers = { 'content-type': 'application/json', 'x-csrf-token': token, cookie };
  const res = await fetch(`${BASE_URL}/api/auth/register`, {
    method: 'POST',
    headers,
    body: JSON.stringify({ email, displayName, password }),
  });
  if (res.status !== 202) throw new Error(`register: ${res.status} ${await res.text()}`);
  const link = await mailedLink(email, '/confirm/');
  const confirmToken = link.slice(link.lastIndexOf('/') + 1);
  const confirmed = await fetch(`${BASE_URL}/api/auth/confirm/${confirmToken}`, {
    method: 'POST',
    headers,
  });
  if (confirmed.status !== 201) {
    throw new Error(`confirm: ${confirmed.status} ${await confirmed.text()}`);
  }
}

async function signInStatus(email: string, password: string): Promise<number> {
  const csrf = await fetch(`${BASE_URL}/api/auth/csrf`);
  const cookie = (csrf.headers.get('set-cookie') ?? '').split(';')[0];
  const { token } = (await csrf.json()) as { token: string };
  const res = await fetch(`${BASE_URL}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-csrf-token': token, cookie },
    body: JSON.stringify({ email, password }),
  });
  return res.status;
}

const rowOf = (page: Page, email: string) => page.getByRole('row').filter({ hasText: email });

describe('site administration of accounts', () => {
  let browser: Browser;
  let watched: WatchedPage;

  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });
  beforeEach(async () => {
    watched = await openPage(browser);
  });
  afterEach(async () => {
    await watched.context.close();
    expect(watched.problems).toEqual([]);
  });

  it('should deactivate, reactivate and delete an account', async () => {
    const { page } = watched;
    const suffix = uniqueSuffix();
    const email = `admin-e2e-${suffix}@chainwright.test`;
    const name = `Ada Account ${suffix}`;
    const password = 'a-long-test-password-7';
    await registerThroughApi(email, name, password);

    await signIn(page, DEMO.owner, DEMO.password);
    await page.goto('/admin');
    const row = rowOf(page, email);
    await row.getByText('Active').waitFor({ state: 'visible' });

    await row.getByRole('button', { name: 'Deactivate' }).click();
    await row.getByText('Deactivated').waitFor({ state: 'visible' });
    await shot(page, 'admin-accounts-01-deactivated');
    expect(await signInStatus(email, password)).toBe(403);

    await row.getByRole('button', { name: 'Reactivate' }).click();
    await row.getByText('Active').waitFor({ state: 'visible' });
    expect(await signInStatus(email, password)).toBe(200);

    await row.getByRole('button', { name: 'Delete' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByText('This cannot be undone.').waitFor({ state: 'visible' });
    await shot(page, 'admin-accounts-02-confirm-delete');
    await dialog.getByRole('button', { name: 'Delete account' }).click();
    await page.getByText(`${name}'s account is deleted`).waitFor({ state: 'visible' });
    // The row now shows the erased account, without its address.
    await rowOf(page, email).waitFor({ state: 'detached' });
    await shot(page, 'admin-accounts-03-deleted');
    expect(await signInStatus(email, password)).toBe(401);
  });
});
