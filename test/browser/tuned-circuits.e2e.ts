/**
 * A tuned circuit no stage declares, end to end against a running server with demo data: the
 * crystal-set example's secondary (coupled coils tuned by the next stage's capacitor) is in
 * the resonator table as found, and swapping the 20 kΩ earphone for a 1 kΩ headphone puts the
 * loading flag on the coupler's card.
 */
import type { Browser, Locator, Page } from 'playwright-core';
import { DEMO, launchBrowser, openPage, shot, signIn, type WatchedPage } from './harness';
import { openChainNamed } from './helpers/chains';
import { cardNamed, flagCodes, selectCard, settled } from './helpers/strip';
import { expectText, waitUntil } from './helpers/wait';

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
    await openChainNamed(page, CRYSTAL_SET);
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
    await selectCard(cardNamed(page, 'Diode detector, 20 kΩ earphone'));
    await page.locator('cw-param-panel input[data-param="rLoad"]').fill('1k');
    await waitUntil(
      async () => (await flagCodes(coupler(page))).includes('tank-overloaded'),
      'the loading flag on the coupler card',
    );
    await settled(page);
    await expectText(table, 'severe');
    const flag = coupler(page).locator('[data-flag-code="tank-overloaded"]');
    // The sentence at the app's default of 4 significant figures (108 at 3, 107.594 at 6).
    expect(await flag.getAttribute('title')).toMatch(
      /^Tuned circuit at node 2 \("Air-core coupler 8 µH : 12 µH" with "Tuning capacitor"\) at 1 MHz: Q falls from 107.6 to/,
    );
    await shot(page, 'tuned-circuits-headphone');
  });
});

function coupler(page: Page): Locator {
  return cardNamed(page, 'Air-core coupler 8 µH : 12 µH');
}
