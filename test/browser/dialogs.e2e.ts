/**
 * The app's own dialogs in place of the browser's boxes (leaving with unsaved edits, a
 * Touchstone reference asked for), the Touchstone 2.0 export from the editor's menu, the
 * tolerance field's width, and a transceiver's summary: a transmitter's figures in its
 * transmit mode, and the choice of a mode where the chain as written cannot be analysed.
 * Screenshots go to test-results/screenshots/dialogs-*.png.
 */
import { readFileSync } from 'node:fs';
import type { Browser, Page } from 'playwright-core';
import { DEMO, launchBrowser, openPage, shot, signIn, type WatchedPage } from './harness';

const SINGLE = 'Shortwave superhet, 7.2 MHz, one preselector tank';
const TRANSCEIVER = '433.92 MHz low-power transceiver, one antenna for transmit and receive';

async function openChain(page: Page, name: string): Promise<void> {
  await page.goto('/');
  await page.waitForURL(/\/w\/[^/]+\/chains$/);
  await page.getByRole('link', { name, exact: true }).first().click();
  await page.waitForURL(/\/chains\/[^/]+$/);
  await page.locator('article.card').first().waitFor();
}

/** The text of the headline figures above the result tabs, once it holds `expected`. */
async function headlineWith(page: Page, expected: string): Promise<string> {
  const headline = page.getByRole('group', { name: 'Headline figures at f0' });
  await headline.getByText(expected).first().waitFor({ timeout: 30000 });
  return (await headline.textContent()) ?? '';
}

/** Which element has the focus, by its text or its label (the tests compile without DOM). */
function focusedName(page: Page): Promise<string> {
  return page.evaluate(() => {
    const el = (globalThis as unknown as { document: { activeElement: FocusedElement | null } })
      .document.activeElement;
    return (el?.getAttribute('aria-label') ?? el?.textContent ?? '').trim();
  });
}

interface FocusedElement {
  getAttribute(name: string): string | null;
  textContent: string | null;
}

describe('our own dialogs, Touchstone 2.0 and the transmit summary', () => {
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
    // Reloading with unsaved edits is asked by the browser itself (beforeunload); no test
    // here keeps those edits.
    watched.page.on('dialog', (dialog) => void dialog.accept());
  });

  afterEach(async () => {
    await watched.context.close();
    expect(watched.problems).toEqual([]);
  });

  it('asks in our dialog before leaving unsaved edits, with a readable tolerance field', async () => {
    const { page } = watched;
    await signIn(page, DEMO.editor, DEMO.password);
    await openChain(page, SINGLE);
    await page.getByRole('button', { name: 'Select Preselector tank' }).click();

    // The tolerance beside a capacitance shows what was typed in full.
    const tolerance = page.locator('cw-param-panel input[data-param="c:tolerance"]');
    await tolerance.fill('12.5 %');
    await page.locator('.chip', { hasText: 'Unsaved edits' }).waitFor();
    const fits = await tolerance.evaluate((input) => {
      const box = input as unknown as { clientWidth: number; scrollWidth: number };
      return { width: box.clientWidth, fits: box.scrollWidth <= box.clientWidth };
    });
    expect(fits.fits).toBe(true);
    expect(fits.width).toBeGreaterThanOrEqual(56);
    await shot(page, 'dialogs-01-tolerance');

    // Leaving for the studies page asks first; Escape stays, with the focus given back.
    const studies = page.getByTestId('open-studies');
    await studies.focus();
    await page.keyboard.press('Enter');
    const leave = page.getByRole('dialog', { name: 'Leave without saving?' });
    await leave.waitFor();
    await shot(page, 'dialogs-03-leave');
    expect(await focusedName(page)).toMatch(/Stay|Leave/);
    await page.keyboard.press('Escape');
    await leave.waitFor({ state: 'detached' });
    expect(page.url()).toMatch(/\/chains\/[^/]+$/);
    await page.waitForFunction(
      () =>
        (
          globalThis as unknown as {
            document: { activeElement: { getAttribute(n: string): string | null } | null };
          }
        ).document.activeElement?.getAttribute('data-testid') === 'open-studies',
    );
    await studies.click();
    await leave.getByRole('button', { name: 'Leave' }).click();
    await page.waitForURL(/\/studies$/);
  });

  it("shows a transmitter's figures, exports its mode as Touchstone 2.0, offers modes as written", async () => {
    const { page } = watched;
    await signIn(page, DEMO.editor, DEMO.password);
    await openChain(page, TRANSCEIVER);
    const mode = (id: string) =>
      page.locator(`[data-testid="mode-selector"] mat-button-toggle[data-mode-id="${id}"] button`);

    await mode('transmit').click();
    const transmitting = await headlineWith(page, 'Into the antenna');
    expect(transmitting).toContain('Harmonic 2·f0 attenuation');
    expect(transmitting).not.toContain('Noise figure');
    await page.getByRole('tab', { name: 'Summary' }).click();
    const summary = page.locator('cw-summary-panel');
    await summary.getByText('Receiver isolation').waitFor();
    expect(await summary.textContent()).not.toContain('Noise figure');
    await shot(page, 'dialogs-04-transmit-summary');

    // Touchstone 2.0 of the mode shown, at a reference asked for in our dialog; a bad value keeps it open.
    await page.getByTestId('export-menu').click();
    await page.getByTestId('export-touchstone').click();
    await page.getByRole('menuitem', { name: 'Version 2.0, other reference…' }).click();
    const ask = page.getByRole('dialog', { name: 'Touchstone 2.0 at another reference' });
    const field = ask.getByLabel('Reference resistance of both ports');
    await field.fill('-5');
    await ask.getByRole('button', { name: 'Export' }).click();
    await ask.getByText('Enter a resistance above 0 Ω.').waitFor();
    await shot(page, 'dialogs-02-reference-refused');
    await field.fill('75 Ω');
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      ask.getByRole('button', { name: 'Export' }).click(),
    ]);
    expect(download.suggestedFilename()).toMatch(/_transmit_75ohm_v2\.s2p$/);
    const text = readFileSync(await download.path(), 'utf8');
    expect(text.split('\n')[0]).toBe('[Version] 2.0');
    expect(text.split('\n')[1]).toContain('Mode "Transmit"');
    expect(text).toContain('[Reference] 75 75');
    expect(text.trimEnd().endsWith('[End]')).toBe(true);

    // As written, both paths at once: a choice of mode rather than a refusal.
    await mode('').click();
    const choose = page.getByTestId('choose-mode');
    await choose.waitFor();
    expect(await page.getByTestId('analysis-refused').count()).toBe(0);
    await shot(page, 'dialogs-05-choose-mode');
    await choose.getByRole('button', { name: 'Receive' }).click();
    await headlineWith(page, 'Noise figure');
    await choose.waitFor({ state: 'detached' });

    // Its read-only link, signed out: stage types and values by name and unit, not by key.
    const chainId = page.url().split('/').pop()!;
    const csrf = (await (await page.request.get('/api/auth/csrf')).json()) as { token: string };
    const made = await page.request.post(`/api/chains/${chainId}/share-links`, {
      data: {},
      headers: { 'x-csrf-token': csrf.token },
    });
    expect(made.status()).toBe(201);
    const visitor = await openPage(browser);
    try {
      await visitor.page.goto(new URL(((await made.json()) as { url: string }).url).pathname);
      const stages = visitor.page.getByRole('list', { name: 'Stages from source to load' });
      await stages.locator('.values').first().waitFor();
      const types = await stages.locator('.type').allTextContents();
      for (const t of types) expect(t.trim()).not.toMatch(/^[a-z]+(-[a-z0-9]+)+$/);
      const values = await stages.locator('.values').allTextContents();
      for (const v of values) expect(v.trim()).toMatch(/^[A-Z]/);
      await shot(visitor.page, 'dialogs-06-shared-labels');
      expect(visitor.problems).toEqual([]);
    } finally {
      await visitor.context.close();
    }
  });
});
