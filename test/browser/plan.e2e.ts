/**
 * The receiver plan in the editor, against a running server with demo data: open the Plan
 * tab on the shortwave superhet, move the IF and watch the image follow, set a blocker and
 * read the desensitisation, and set a quiet rural site and read the outside-noise statement.
 */
import type { Browser, Page } from 'playwright-core';
import { DEMO, launchBrowser, openPage, shot, signIn, type WatchedPage } from './harness';

const SINGLE = 'Shortwave superhet, 7.2 MHz, one preselector tank';

/** The input-frequency cell of the image row, e.g. "8.11 MHz". */
async function imageFrequency(page: Page): Promise<string> {
  const cell = page.locator('tr[data-kind="image"] td').nth(2);
  await cell.waitFor();
  return (await cell.innerText()).trim();
}

/** Types into a planning field (by its data-param) as a user would. */
async function typeInto(page: Page, param: string, text: string): Promise<void> {
  const field = page.locator(`input[data-param="${param}"]`);
  await field.fill(text);
}

describe('receiver plan', () => {
  let browser: Browser;
  let watched: WatchedPage;

  beforeAll(async () => {
    browser = await launchBrowser();
  });

  afterAll(async () => {
    await browser?.close();
  });

  beforeEach(async () => {
    watched = await openPage(browser, {});
    await watched.context.setDefaultTimeout(20_000);
  });

  afterEach(async () => {
    await watched.context.close();
    expect(watched.problems).toEqual([]);
  });

  it('follows the IF, a blocker and the site as the designer changes them', async () => {
    const { page } = watched;
    await page.setViewportSize({ width: 1440, height: 900 });
    await signIn(page, DEMO.editor, DEMO.password);
    await page.waitForURL(/\/w\/[^/]+\/chains$/);
    await page.getByRole('link', { name: SINGLE, exact: true }).click();
    await page.waitForURL(/\/chains\/[^/]+$/);
    await page.getByRole('tab', { name: 'Plan' }).click();

    // 455 kHz IF, LO above: the image is 910 kHz above 7.2 MHz.
    expect(await imageFrequency(page)).toBe('8.11 MHz');
    await page.getByRole('button', { name: 'Save PNG' }).and(page.locator(':enabled')).first().waitFor(); // prettier-ignore
    await shot(page, 'plan-455k');

    await typeInto(page, 'plan-if', '1.6 MHz');
    await page.waitForFunction(
      () =>
        (globalThis as unknown as { document: { querySelector(s: string): { textContent: string } | null } }).document // prettier-ignore
          .querySelector('tr[data-kind="image"] td:nth-of-type(3)')
          ?.textContent?.includes('10.4 MHz') ?? false,
    );
    expect(await imageFrequency(page)).toBe('10.4 MHz');

    await typeInto(page, 'plan-blocker-level', '-70');
    const desense = page.locator('[data-figure="desense"] .fig-value');
    await page.waitForFunction(
      () =>
        /^\d+\.\d\d dB$/.test(
          (globalThis as unknown as { document: { querySelector(s: string): { textContent: string } | null } }).document // prettier-ignore
            .querySelector('[data-figure="desense"] .fig-value')
            ?.textContent?.trim() ?? '',
        ),
    );
    expect(Number((await desense.innerText()).replace(' dB', ''))).toBeGreaterThanOrEqual(0);

    await page.locator('[data-param="plan-environment"]').click();
    await page.getByRole('option', { name: 'Quiet rural' }).click();
    const statement = page.locator('[data-figure="outside-statement"]');
    await page.waitForFunction(() =>
      ((globalThis as unknown as { document: { querySelector(s: string): { textContent: string } | null } }).document // prettier-ignore
        .querySelector('[data-figure="outside-statement"]')
        ?.textContent ?? '').includes('quiet rural area'),
    );
    expect(await statement.innerText()).toMatch(/^At 7\.2 MHz in a quiet rural area the outside noise is/); // prettier-ignore
    await shot(page, 'plan-1600k-quiet-rural');
  });
});
