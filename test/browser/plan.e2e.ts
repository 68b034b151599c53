/**
 * The receiver plan in the editor, against a running server with demo data: open the Plan
 * tab on the shortwave superhet, move the IF and watch the image follow, set a blocker and
 * read the desensitisation, and set a quiet rural site and read the outside-noise statement
 * (before the IF moves away from the IF filter's centre, which breaks the chain on purpose).
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

/** The page's document, typed just enough (the tests compile without DOM types). */
type PageDoc = { document: { querySelector(s: string): { textContent: string | null } | null } };

/** Waits until the first element matching `selector` has text matching `pattern`; returns it. */
async function waitForText(page: Page, selector: string, pattern: RegExp): Promise<string> {
  await page.waitForFunction(
    ([sel, source]) =>
      new RegExp(source).test(
        ((globalThis as unknown as PageDoc).document.querySelector(sel)?.textContent ?? '').trim(),
      ),
    [selector, pattern.source] as const,
  );
  return (await page.locator(selector).first().innerText()).trim();
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
    expect(await imageFrequency(page)).toMatch(/^8\.110* MHz$/);
    const plotReady = page.getByRole('button', { name: 'Save PNG' }).and(page.locator(':enabled'));
    await plotReady.first().waitFor();
    await shot(page, 'plan-455k');

    await page.locator('[data-param="plan-environment"]').click();
    await page.getByRole('option', { name: 'Quiet rural' }).click();
    const statement = await waitForText(page, '[data-figure="outside-statement"]', /quiet rural/);
    expect(statement).toMatch(/^At 7\.2 MHz in a quiet rural area the outside noise is/);

    await typeInto(page, 'plan-blocker-level', '-70');
    const desense = await waitForText(
      page,
      '[data-figure="desense"] .fig-value',
      /^\d+(\.\d+)? dB$/,
    );
    expect(Number(desense.replace(' dB', ''))).toBeGreaterThanOrEqual(0);

    await typeInto(page, 'plan-if', '1.6 MHz');
    await waitForText(page, 'tr[data-kind="image"] td:nth-of-type(3)', /^10\.40* MHz$/);
    expect(await imageFrequency(page)).toMatch(/^10\.40* MHz$/);
    await plotReady.first().waitFor();
    await shot(page, 'plan-1600k-quiet-rural');
  });
});
