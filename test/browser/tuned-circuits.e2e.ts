/**
 * A tuned circuit no stage declares, end to end against a running server with demo data: the
 * crystal-set example's secondary (coupled coils tuned by the next stage's capacitor) is in
 * the resonator table as found, and swapping the 20 kΩ earphone for a 1 kΩ headphone puts the
 * loading flag on the coupler's card.
 */
import type { Browser, Locator, Page } from 'playwright-core';
import { DEMO, launchBrowser, openPage, shot, signIn, type WatchedPage } from './harness';

const CRYSTAL_SET = 'Crystal set, 1 MHz, coupled coils with a tuned secondary';

describe('tuned circuits found in the network', () => {
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

  it('should list the tuned secondary and flag its card when a 1 kΩ headphone loads it', async () => {
    const { page } = watched;
    await signIn(page, DEMO.editor, DEMO.password);
    await page.waitForURL(/\/w\/[^/]+\/chains$/);
    await page.getByRole('link', { name: CRYSTAL_SET, exact: true }).click();
    await page.waitForURL(/\/chains\/[^/]+$/);
    await settled(page);

    // The resonator table shows the secondary, found from the coupler and the capacitor.
    await page.getByRole('tab', { name: 'Resonators & selectivity' }).click();
    const table = page.getByRole('region', { name: 'Resonators' });
    await expectText(table, 'tuned circuit at node 2');
    await expectText(table, 'found: Air-core coupler 8 µH : 12 µH + Tuning capacitor');
    await expectText(table, 'light');
    expect(await flagCodes(coupler(page))).toEqual([]);
    await shot(page, 'tuned-circuits-earphone');

    // The 1 kΩ headphone: select the detector, change its load.
    await cardNamed(page, 'Diode detector, 20 kΩ earphone')
      .getByRole('button', { name: /^Select / })
      .click();
    await page.locator('cw-param-panel input[data-param="rLoad"]').fill('1k');
    await waitUntil(
      async () => (await flagCodes(coupler(page))).includes('tank-overloaded'),
      'the loading flag on the coupler card',
    );
    await settled(page);
    await expectText(table, 'severe');
    const flag = coupler(page).locator('[data-flag-code="tank-overloaded"]');
    expect(await flag.getAttribute('title')).toMatch(
      /^Tuned circuit at node 2 \("Air-core coupler 8 µH : 12 µH" with "Tuning capacitor"\) at 1 MHz: Q falls from 108 to/,
    );
    await shot(page, 'tuned-circuits-headphone');
  });
});

function cardNamed(page: Page, label: string): Locator {
  return page.locator('cw-stage-strip .slot').filter({ hasText: label }).first();
}

function coupler(page: Page): Locator {
  return cardNamed(page, 'Air-core coupler 8 µH : 12 µH');
}

async function flagCodes(card: Locator): Promise<string[]> {
  return card
    .locator('[data-flag-code]')
    .evaluateAll((els) => els.map((el) => el.getAttribute('data-flag-code') ?? ''));
}

async function settled(page: Page): Promise<void> {
  await waitUntil(
    async () =>
      (await page.getByRole('progressbar', { name: 'Analysing the chain' }).count()) === 0,
    'the analysis to settle',
  );
}

async function expectText(locator: Locator, text: string): Promise<void> {
  await waitUntil(
    async () => ((await locator.first().textContent()) ?? '').includes(text),
    `"${text}"`,
  );
}

async function waitUntil(
  check: () => Promise<boolean>,
  what: string,
  timeoutMs = 15000,
): Promise<void> {
  const end = Date.now() + timeoutMs;
  while (Date.now() < end) {
    if (await check()) return;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`timed out waiting for ${what}`);
}
