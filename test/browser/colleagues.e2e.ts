/**
 * Working with colleagues end to end, two people in two browser contexts against a running
 * server whose mail goes to the local catcher (CW_MAIL_DIR): the owner invites, the
 * colleague accepts from the mailed link, both open the same chain and see each other, one
 * saves and the other is told at once, a comment on a stage shows on the other's card, the
 * owner reads the revision diff, then shares a read-only link that opens signed out.
 */
import type { Browser, Page } from 'playwright-core';
import { BASE_URL, DEMO, launchBrowser, openPage, shot, signIn, type WatchedPage } from './harness';
import { mailedLink } from './mail';

/** Calls the API as the signed-in user of `page` (session cookie and its CSRF token). */
async function api(page: Page, method: 'post', url: string, data: unknown) {
  const { token } = (await (await page.request.get('/api/auth/csrf')).json()) as { token: string };
  const res = await page.request.fetch(url, { method, data, headers: { 'x-csrf-token': token } });
  if (!res.ok()) throw new Error(`${method} ${url}: ${res.status()} ${await res.text()}`);
  return res.json();
}

describe('working with colleagues', () => {
  let browser: Browser;
  let owner: WatchedPage;
  let colleague: WatchedPage;
  let visitor: WatchedPage;

  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser.close();
  });

  it('should invite, meet on a chain, tell of a save and a comment, diff and share', async () => {
    const suffix = Date.now().toString(36);
    const email = `colleague-${suffix}@chainwright.test`;
    const name = `Cleo Coil ${suffix}`;

    // The owner invites a colleague who has no account yet.
    owner = await openPage(browser);
    const o = owner.page;
    await signIn(o, DEMO.owner, DEMO.password);
    await o.waitForURL(/\/w\/[^/]+\/chains$/);
    const wid = /\/w\/([^/]+)\//.exec(o.url())![1];
    await o.goto(`/w/${wid}/members`);
    await o.getByLabel('E-mail').fill(email);
    await o.getByRole('button', { name: 'Send invitation' }).click();
    await o.getByTestId('invite-notice').waitFor();
    await o.getByText(email).first().waitFor();
    await shot(o, 'colleagues-01-owner-invites');

    // The owner (a site admin) reads the invitation in the development mailbox: the server
    // runs the local mail catcher, so the menu offers it.
    await o.getByRole('button', { name: /, account menu$/ }).click();
    await o.getByRole('menuitem', { name: 'Development mailbox' }).click();
    await o.waitForURL(/\/admin\/mail$/);
    await o.getByRole('button', { name: new RegExp(`to ${email}`) }).click();
    const reader = o.getByRole('article', { name: 'Message' });
    await reader.getByRole('heading', { name: /invites you to/ }).waitFor();
    await reader.getByRole('button', { name: 'As plain text' }).click();
    const mailLink = reader.getByTestId('mail-text').getByRole('link');
    expect(await mailLink.getAttribute('href')).toMatch(/\/invitation\/[A-Za-z0-9_-]{43}$/);
    await shot(o, 'colleagues-01b-development-mailbox');

    // The colleague accepts from the mailed link, choosing a name and a password.
    const invitation = await mailedLink(email, '/invitation/');
    colleague = await openPage(browser);
    const c = colleague.page;
    await c.goto(invitation);
    await c.getByTestId('invitation-summary').waitFor();
    await c.getByLabel('Your name, as colleagues will see it').fill(name);
    await c.getByLabel('Choose a password').fill('quiet-antenna-mast');
    await shot(c, 'colleagues-02-accept-invitation');
    await c.getByRole('button', { name: 'Create account and join' }).click();
    await c.waitForURL(new RegExp(`/w/${wid}/chains$`));

    // A chain of their own to meet on (so the demo chains stay as they are).
    const examples = (await (await o.request.get('/api/examples')).json()) as { key: string }[];
    const chain = (await api(o, 'post', `/api/workspaces/${wid}/chains`, {
      fromExample: examples[0].key,
      name: `Meeting point ${suffix}`,
    })) as { id: string };
    const chainUrl = `/w/${wid}/chains/${chain.id}`;
    await o.goto(chainUrl);
    await c.goto(chainUrl);
    await o.locator(`[data-testid="presence"][aria-label="${name} is here too"]`).waitFor();
    await c.locator('[data-testid="presence"][aria-label="Olga Owner is here too"]').waitFor();
    await shot(o, 'colleagues-03-owner-sees-colleague');

    // The owner saves; the colleague is told at once and loads the new version.
    await o.getByRole('button', { name: 'Duplicate stage' }).first().click();
    await o.getByLabel('Save message').fill('Second preselector tank');
    await o.getByRole('button', { name: 'Save', exact: true }).click();
    await o.getByText('Saved · v2').waitFor();
    const notice = c.getByTestId('saved-elsewhere');
    await notice.waitFor();
    await shot(c, 'colleagues-04-colleague-told-of-save');
    await notice.getByRole('button', { name: 'Load version 2' }).click();
    await c.getByText('Saved · v2').waitFor();

    // The colleague (an editor) comments on a stage; the owner's card shows the count.
    await c.getByTestId('stage-comments').nth(1).click();
    await c.getByLabel('New comment').fill(`Is this tank loaded too heavily? ${DEMO.owner}`);
    await c.getByRole('button', { name: 'Post comment' }).click();
    await c.getByTestId('comment').first().waitFor();
    // The owner, mentioned by address, is told by mail with a link to the stage.
    await c.getByText(`Mentioned by mail: ${DEMO.owner}.`).waitFor();
    const mention = await mailedLink(DEMO.owner, `/w/${wid}/chains/`);
    expect(new URL(mention).pathname).toBe(chainUrl);
    await shot(c, 'colleagues-05-colleague-comments');
    await o
      .locator('[data-testid="stage-comments"][aria-label="1 comment on this stage"]')
      .waitFor();
    await shot(o, 'colleagues-06-owner-sees-comment-count');

    // The owner reads what changed between version 1 and 2.
    await o.getByRole('radio', { name: 'Changes' }).click();
    await o.getByRole('button', { name: 'Show changes' }).click();
    const diff = o.getByTestId('revision-diff');
    await diff.getByText('Stages added').waitFor();
    await diff.getByText('Key figures').waitFor();
    await shot(o, 'colleagues-07-owner-reads-diff');

    // A read-only link opens signed out; nothing there writes.
    await o.getByRole('button', { name: 'Share' }).click();
    await o.getByRole('button', { name: 'Make a read-only link' }).click();
    const url = await o.getByTestId('share-url').inputValue();
    await shot(o, 'colleagues-08-share-dialog');
    visitor = await openPage(browser);
    const v = visitor.page;
    await v.goto(BASE_URL + new URL(url).pathname);
    await v.getByTestId('shared-ribbon').waitFor();
    await v.getByRole('heading', { name: `Meeting point ${suffix}` }).waitFor();
    expect(await v.getByRole('button', { name: 'Save', exact: true }).count()).toBe(0);
    await shot(v, 'colleagues-09-read-only-link-signed-out');

    expect(owner.problems).toEqual([]);
    expect(colleague.problems).toEqual([]);
    expect(visitor.problems).toEqual([]);
  });
});
