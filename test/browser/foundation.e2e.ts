/**
 * The client foundation end to end: a new account, a first workspace, a first chain, and
 * signing out; then the demo viewer, who must see no edit controls.
 */
import type { Browser, Page } from 'playwright-core';
import { mailedLink } from './mail';
import {
  DEMO,
  launchBrowser,
  openPage,
  shot,
  signIn,
  signOut,
  uniqueSuffix,
  type WatchedPage,
} from './harness';

describe('client foundation', () => {
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
    // Any console error, page error or 5xx during the test fails it.
    expect(watched.problems).toEqual([]);
  });

  it('should register, create a workspace and a chain, see it listed, and sign out', async () => {
    const { page } = watched;
    const suffix = uniqueSuffix();
    const email = `e2e-${suffix}@chainwright.test`;
    const displayName = `Tess Tuner ${suffix}`;
    const password = 'tuned-circuit-42';

    await page.goto('/');
    await page.waitForURL('**/sign-in');
    await shot(page, 'foundation-01-sign-in');

    await page.getByRole('link', { name: 'Create an account' }).click();
    await page.waitForURL('**/register');
    // Submitting empty shows the schema's own messages.
    await page.getByRole('button', { name: 'Create account' }).click();
    await expectVisible(page.getByText('Enter a display name.'));
    await expectVisible(page.getByText('Enter a valid e-mail address.'));
    await shot(page, 'foundation-02-register-errors');

    await page.getByLabel('Display name').fill(displayName);
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill(password);
    await page.getByRole('button', { name: 'Create account' }).click();

    // The address is confirmed by mail before the account exists.
    await page.getByTestId('registration-pending').waitFor();
    await page.goto(await mailedLink(email, '/confirm/'));
    await page.getByRole('button', { name: 'Confirm and sign in' }).click();

    // A brand-new account has no workspace yet (unless the server gives one).
    await page.waitForURL(/\/(welcome|w\/[^/]+\/chains)$/);
    if (page.url().endsWith('/welcome')) {
      await shot(page, 'foundation-03-welcome');
      await page.getByLabel('Workspace name').fill(`Bench ${suffix}`);
      await page.getByRole('button', { name: 'Create workspace' }).click();
    }
    await page.waitForURL(/\/w\/[^/]+\/chains$/);
    await expectVisible(page.getByRole('heading', { name: 'Chains' }));
    await expectVisible(page.getByText('No chains here yet.'));
    await shot(page, 'foundation-04-empty-list');

    await page.getByRole('button', { name: 'New chain' }).click();
    const dialog = page.getByRole('dialog', { name: 'New chain' });
    await expectVisible(dialog.getByRole('heading', { name: 'New chain' }));
    await dialog.getByLabel('Name').fill('Loop antenna front end');
    await shot(page, 'foundation-05-new-chain-dialog');
    // Create opens the new chain; the list then shows it.
    await dialog.getByRole('button', { name: 'Create' }).click();
    await page.waitForURL(/\/chains\/[^/]+$/);
    await page.goBack();
    await page.waitForURL(/\/w\/[^/]+\/chains$/);

    await expectVisible(page.getByRole('link', { name: 'Loop antenna front end' }));
    await rowAction(page, 'Loop antenna front end', 'Delete');
    await shot(page, 'foundation-06-chain-listed');
    await page.keyboard.press('Escape');

    // Duplicate, rename the copy, then delete it after confirming.
    await rowAction(page, 'Loop antenna front end', 'Duplicate', true);
    await expectVisible(page.getByRole('link', { name: 'Loop antenna front end (copy)' }));
    await rowAction(page, 'Loop antenna front end (copy)', 'Rename', true);
    const renameDialog = page.getByRole('dialog', { name: 'Rename chain' });
    await renameDialog.getByLabel('Chain name').fill('Loop front end, wider tank');
    await renameDialog.getByRole('button', { name: 'Rename' }).click();
    await expectVisible(page.getByRole('link', { name: 'Loop front end, wider tank' }));
    await rowAction(page, 'Loop front end, wider tank', 'Delete', true);
    const confirm = page.getByRole('dialog', { name: 'Delete chain' });
    await expectVisible(confirm.getByText('This cannot be undone.'));
    await shot(page, 'foundation-06b-confirm-delete');
    await confirm.getByRole('button', { name: 'Delete' }).click();
    await page
      .getByRole('link', { name: 'Loop front end, wider tank' })
      .waitFor({ state: 'detached' });
    // The list is asked again after the delete; wait for its answer, not a fixed time.
    await page.locator('tr.mat-mdc-row').nth(1).waitFor({ state: 'detached' });
    expect(await page.locator('tr.mat-mdc-row').count()).toBe(1);

    // The filter asks the server; a name that matches nothing empties the table.
    await page.getByLabel('Filter by name or description').fill('no-such-chain-xyz');
    await expectVisible(page.getByText('No chain matches “no-such-chain-xyz”.'));
    await page.getByLabel('Filter by name or description').fill('');
    await expectVisible(page.getByRole('link', { name: 'Loop antenna front end' }));

    // Dark theme, remembered across a reload.
    await page.getByRole('button', { name: 'Switch to the dark theme' }).click();
    await page.reload();
    await expectVisible(page.getByRole('button', { name: 'Switch to the light theme' }));
    await expectVisible(page.getByRole('link', { name: 'Loop antenna front end' }));
    await shot(page, 'foundation-07-chain-list-dark');
    await page.getByRole('button', { name: 'Switch to the light theme' }).click();

    await page.getByRole('button', { name: displayName }).click();
    await shot(page, 'foundation-08-account-menu');
    await page.getByRole('menuitem', { name: 'Account' }).click();
    await expectVisible(page.getByRole('heading', { name: 'Change password' }));
    await expectVisible(page.getByText(email));
    // A short new password is refused with the schema's message before anything is sent.
    await page.getByLabel('Current password').fill(password);
    await page.getByLabel('New password').fill('short');
    await page.getByRole('button', { name: 'Change password' }).click();
    await expectVisible(page.getByText('A password needs at least 10 characters.'));
    await shot(page, 'foundation-08b-account');
    await signOut(page, displayName);
    await expectVisible(page.getByRole('heading', { name: 'Sign in' }));

    // Signing in again lands in the workspace with the chain.
    await signIn(page, email, password);
    await expectVisible(page.getByRole('link', { name: 'Loop antenna front end' }));
    await signOut(page, displayName);
  });

  it('should show the demo viewer the chains but no edit controls', async () => {
    const { page } = watched;
    await signIn(page, DEMO.viewer, DEMO.password);
    await page.waitForURL(/\/w\/[^/]+\/chains$/);
    await expectVisible(page.getByRole('heading', { name: 'Chains' }));
    // Wait for the list to answer: either rows or the viewer's empty text.
    await page.locator('tr.mat-mdc-row, .cw-empty').first().waitFor();
    await shot(page, 'foundation-09-viewer-list');

    expect(await page.getByRole('button', { name: 'New chain' }).count()).toBe(0);
    // A viewer's row menu (shown where a row can be compared) changes nothing.
    const menus = page.getByRole('button', { name: /^Actions for / });
    if ((await menus.count()) > 0) {
      await menus.first().click();
      await page.getByRole('menu').waitFor();
      expect(
        await page.getByRole('menuitem', { name: /^(Delete|Rename|Duplicate)$/ }).count(),
      ).toBe(0);
      await page.keyboard.press('Escape');
    }

    // The members page lists people but offers a viewer no changes.
    await page
      .getByRole('button', { name: /Vera Viewer|Viewer/ })
      .first()
      .click();
    await page.getByRole('menuitem', { name: 'Members' }).click();
    await page.waitForURL(/\/members$/);
    await expectVisible(page.getByText('Only owners of this workspace can invite'));
    expect(await page.getByRole('button', { name: 'Send invitation' }).count()).toBe(0);
    await shot(page, 'foundation-10-viewer-members');
  });

  it('should follow a dark system preference until the user chooses', async () => {
    const dark = await openPage(browser, { colorScheme: 'dark' });
    try {
      await dark.page.goto('/sign-in');
      await expectVisible(dark.page.getByRole('button', { name: 'Switch to the light theme' }));
      expect(await dark.page.locator('html.cw-dark').count()).toBe(1);
      await dark.page.getByRole('button', { name: 'Sign in' }).click();
      await expectVisible(dark.page.getByText('Enter a valid e-mail address.'));
      await shot(dark.page, 'foundation-16-sign-in-dark');
      expect(dark.problems).toEqual([]);
    } finally {
      await dark.context.close();
    }
  });

  it('should fit a phone-width screen and show keyboard focus', async () => {
    const { page } = watched;
    await page.setViewportSize({ width: 390, height: 780 });
    await signIn(page, DEMO.editor, DEMO.password);
    await page.waitForURL(/\/w\/[^/]+\/chains$/);
    await page.locator('tr.mat-mdc-row, .cw-empty').first().waitFor();
    // The page must not scroll sideways; a wide table scrolls inside its own frame.
    const overflow = await page.evaluate(() => {
      const root = (
        globalThis as unknown as {
          document: { documentElement: { scrollWidth: number; clientWidth: number } };
        }
      ).document.documentElement;
      return root.scrollWidth - root.clientWidth;
    });
    expect(overflow).toBeLessThanOrEqual(0);
    await page.getByLabel('Filter by name or description').focus();
    await page.keyboard.press('Shift+Tab');
    await shot(page, 'foundation-15-phone-focus');
  });

  it('should show the owner the members page and the site administration', async () => {
    const { page } = watched;
    await signIn(page, DEMO.owner, DEMO.password);
    await page.waitForURL(/\/w\/[^/]+\/chains$/);
    await page.locator('tr.mat-mdc-row, .cw-empty').first().waitFor();
    await shot(page, 'foundation-11-owner-list');

    const menu = page.getByRole('button', { name: /Olga Owner|Owner/ }).first();
    await menu.click();
    await page.getByRole('menuitem', { name: 'Members' }).click();
    await expectVisible(page.getByRole('button', { name: 'Send invitation' }));
    await expectVisible(page.getByRole('cell', { name: DEMO.viewer }));
    await shot(page, 'foundation-12-owner-members');

    // Renaming the workspace shows at once in the heading and the toolbar's switcher.
    const heading = await page.getByRole('heading', { name: /^Members of / }).textContent();
    const oldName = (heading ?? '').replace(/^Members of /, '').trim();
    await page.getByRole('button', { name: 'Rename workspace' }).click();
    const rename = page.getByRole('dialog', { name: 'Rename workspace' });
    await rename.getByLabel('Workspace name').fill(`${oldName} (renamed)`);
    await rename.getByRole('button', { name: 'Rename' }).click();
    await expectVisible(page.getByRole('heading', { name: `Members of ${oldName} (renamed)` }));
    await page.getByRole('button', { name: 'Rename workspace' }).click();
    await rename.getByLabel('Workspace name').fill(oldName);
    await rename.getByRole('button', { name: 'Rename' }).click();
    await expectVisible(page.getByRole('heading', { name: `Members of ${oldName}`, exact: true }));

    await menu.click();
    await page.getByRole('menuitem', { name: 'Site administration' }).click();
    await expectVisible(page.getByRole('switch', { name: 'Open registration' }));
    await expectVisible(page.getByRole('cell', { name: DEMO.viewer }));
    await shot(page, 'foundation-13-admin');

    await page.goto('/no/such/page');
    await expectVisible(page.getByRole('heading', { name: 'Nothing at this address' }));
    await shot(page, 'foundation-14-not-found');
  });
});

// Helpers
/** Opens a chain row's actions menu and waits for `item` in it; clicks it when asked. */
async function rowAction(page: Page, chain: string, item: string, click = false): Promise<void> {
  await page.getByRole('button', { name: `Actions for ${chain}`, exact: true }).click();
  const entry = page.getByRole('menuitem', { name: item, exact: true });
  await entry.waitFor();
  if (click) await entry.click();
}

async function expectVisible(locator: { waitFor(o: { state: 'visible' }): Promise<void> }) {
  await locator.waitFor({ state: 'visible' });
}
