/**
 * Noise and levels at the real impedances, in the editor: noise temperatures beside the
 * noise figures, volts and dBm across a chosen reference, VSWR only once a reference is
 * chosen, the noise-mismatch flag, and the warning on an unusual value. Screenshots go to
 * test-results/screenshots/noise-*.png.
 */
import type { Browser, Locator, Page } from 'playwright-core';
import { DEMO, launchBrowser, openPage, shot, signIn, type WatchedPage } from './harness';

const CHAIN = '868 MHz sensor-network receiver, SAW filter and L-match to the LNA';

describe('noise and levels in the editor', () => {
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

  it('shows noise temperatures, the chosen reference and the unusual-value warning', async () => {
    const { page } = watched;
    await signIn(page, DEMO.editor, DEMO.password);
    await page.waitForURL(/\/w\/[^/]+\/chains$/);
    await page.getByRole('link', { name: CHAIN }).first().click();
    await page.waitForURL(/\/chains\/[^/]+$/);
    const budget = page.getByRole('region', { name: 'Budget by node' });
    await budget.waitFor();
    await textAppears(budget, 'Cumulative noise temperature');
    await textAppears(budget, 'no reference set');
    await textAppears(page.locator('body'), 'noise figure stated for');
    await budget.getByText('Cumulative noise temperature').scrollIntoViewIfNeeded();
    await shot(page, 'noise-01-budget-no-reference');

    // A 50 Ω reference for the whole chain: VSWR and return loss appear against it.
    await page
      .getByRole('radio', { name: 'Chain', exact: true })
      .or(page.getByRole('button', { name: 'Chain', exact: true }))
      .first()
      .click();
    const reference = page.getByLabel('Reference for VSWR and return loss');
    await reference.fill('50');
    await reference.press('Tab');
    await textAppears(budget, 're 50 Ω');
    await reference.scrollIntoViewIfNeeded();
    await budget.getByText('against the chosen reference').last().scrollIntoViewIfNeeded();
    await shot(page, 'noise-02-reference-50-ohm');

    // A capacitor typed as "2.2k" reads as 2.2 kF: accepted, with a warning on the field.
    await page
      .locator('cw-stage-strip .slot')
      .filter({ has: page.locator('article[data-stage-type="unilateral-amplifier"]') })
      .first()
      .getByRole('button', { name: /^Select / })
      .click();
    await page
      .getByRole('radio', { name: 'Stage', exact: true })
      .or(page.getByRole('button', { name: 'Stage', exact: true }))
      .first()
      .click();
    await page.locator('cw-param-panel input[data-param="cin"]').fill('2.2k');
    await textAppears(page.locator('cw-param-panel'), 'unusual: typical is');
    await shot(page, 'noise-03-unusual-value');
  });
});

/** Waits (up to 20 s) until the locator's text contains `text`. */
async function textAppears(where: Locator, text: string): Promise<void> {
  const page: Page = where.page();
  const deadline = Date.now() + 20_000;
  for (;;) {
    const seen = (await where.textContent()) ?? '';
    if (seen.includes(text)) return;
    if (Date.now() > deadline) throw new Error(`"${text}" did not appear; saw: ${seen.slice(0, 500)}`); // prettier-ignore
    await page.waitForTimeout(200);
  }
}
