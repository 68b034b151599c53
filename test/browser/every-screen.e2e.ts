/**
 * Every screen at three widths: a desktop (1440×900), a tablet (1024×768) and a phone
 * (390×844). On each: no sideways page overflow, no serious or critical axe-core violation,
 * and the figures that matter readable. The editor opens the long-wave loading example and
 * reads the budget's nodes, the resonators' loading ratio and downstream share, the flags,
 * the plots, the plan and the summary; then compare, studies, account, admin and the
 * read-only link page. Screenshots go to test-results/screenshots/every-screen-*.png.
 */
import type { Browser, BrowserContext, Locator, Page } from 'playwright-core';
import { BASE_URL, DEMO, launchBrowser, shot } from './harness';
import { checkScreen } from './helpers/axe';
import { filterChains } from './helpers/chains';
import { WIDTHS, type Width } from './helpers/widths';

const LOADING_DEMO = 'Long-wave time signal, ferrite loop into a diode detector';
const LIGHT_LOAD = 'Long-wave time signal, ferrite loop into a lightly loading detector';
const DESIGNED_MATCH = '868 MHz sensor-network receiver, SAW filter and L-match to the LNA';

describe('every screen at three widths', () => {
  let browser: Browser;
  /** The read-only link made once (at the first width) and opened at every width. */
  let shareUrl: string | null = null;

  beforeAll(async () => {
    browser = await launchBrowser();
  });

  afterAll(async () => {
    await browser?.close();
  });

  for (const size of WIDTHS) {
    it(`should fit, read and pass axe at ${size.width}×${size.height} (${size.name})`, async () => {
      const context = await browser.newContext({
        baseURL: BASE_URL,
        viewport: { width: size.width, height: size.height },
        colorScheme: 'light',
        // Touch on the phone: sheets and sideways scrolling as a phone user meets them.
        hasTouch: size.name === 'phone',
        isMobile: size.name === 'phone',
      });
      const page = await context.newPage();
      const problems: string[] = [];
      watch(page, problems);
      try {
        await walk(page, context, size, problems);
      } finally {
        await context.close();
      }
      expect(problems).toEqual([]);
    });
  }

  async function walk(
    page: Page,
    context: BrowserContext,
    size: Width,
    problems: string[],
  ): Promise<void> {
    const check = (screen: string) => checkScreen(page, `${size.name} ${screen}`, problems);
    const snap = (screen: string) => shot(page, `every-screen-${size.name}-${screen}`);

    // Sign-in: says in one sentence what the product is.
    await page.goto('/sign-in');
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    const pitch = await page.getByTestId('product-sentence').innerText();
    expect(pitch).toMatch(/receiver front end/i);
    await check('sign-in');
    await snap('01-sign-in');

    await page.getByLabel('E-mail').fill(DEMO.owner);
    await page.getByLabel('Password').fill(DEMO.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(/\/w\/[^/]+\/chains$/);

    // Chain list: more than names (f0 and stage count), actions in a menu, author once.
    // Filtered by name: the list shows a page at a time, and earlier tests add chains.
    await filterChains(page, 'Long-wave time signal');
    const row = page.getByRole('row', { name: new RegExp(escape(LOADING_DEMO)) });
    await row.waitFor();
    const rowText = await row.innerText();
    expect(rowText).toMatch(/\d+(\.\d+)? kHz/);
    // A phone shows the figures under the name; wider screens in columns of their own.
    if (size.name === 'phone') expect(rowText).toMatch(/\d+ stages?/);
    expect(count(rowText, 'Demo Owner') + count(rowText, 'Olga Owner')).toBeLessThanOrEqual(1);
    await row.getByRole('button', { name: `Actions for ${LOADING_DEMO}` }).click();
    await page.getByRole('menuitem', { name: 'Duplicate' }).waitFor();
    await check('chain list, actions menu open');
    await snap('02-chain-list-menu');
    await page.keyboard.press('Escape');
    await check('chain list');
    await snap('03-chain-list');
    const demoHref = await row.getByRole('link', { name: LOADING_DEMO }).getAttribute('href');
    const lightHref = await page
      // Not exact: a variant's link starts with an arrow under its parent.
      .getByRole('link', { name: LIGHT_LOAD })
      .getAttribute('href');
    await filterChains(page, DESIGNED_MATCH);
    const matchHref = await page
      .getByRole('link', { name: DESIGNED_MATCH, exact: true })
      .getAttribute('href');
    expect(demoHref).toBeTruthy();
    expect(lightHref).toBeTruthy();

    // The editor with the loading example.
    await page.goto(demoHref!);
    const cards = page.locator('cw-stage-card');
    await cards.first().waitFor();
    await page.locator('.headline').waitFor();
    await check('editor, budget');
    await snap('04-editor-budget');
    await readBudget(page);
    // Skip links lead the tab order to the strip and the results.
    await page.locator('body').focus();
    await page.keyboard.press('Tab');
    await page.keyboard.press('Tab');
    expect(await page.evaluate(focusedText)).toBe('Skip to the stages');
    await page.keyboard.press('Enter');
    expect(await page.evaluate(focusedId)).toBe('cw-strip');
    await page.keyboard.press('Tab');
    expect(await page.evaluate(focusedText)).toMatch(/.+/);

    await tab(page, 'Resonators & selectivity');
    await readResonators(page);
    await check('editor, resonators');
    await snap('05-editor-resonators');

    await tab(page, /^Flags/);
    const flags = page.locator('cw-flags-list li');
    await flags.first().waitFor();
    expect(await page.locator('cw-flags-list').innerText()).toMatch(/tank|loaded|Q/i);
    await check('editor, flags');
    await snap('06-editor-flags');

    await tab(page, 'Plots');
    await page.locator('cw-result-plot .js-plotly-plot').first().waitFor({ timeout: 60000 });
    await check('editor, plots');
    await snap('07-editor-plots');

    await tab(page, 'Plan');
    await page.locator('cw-plan-view').waitFor();
    await check('editor, plan');
    await snap('08-editor-plan');

    await tab(page, 'Summary');
    await page.locator('cw-summary-panel').waitFor();
    await check('editor, summary');

    // Stage values: beside the strip on a desktop or tablet, as a sheet on a phone.
    await cards
      .nth(1)
      .getByRole('button', { name: /^Select / })
      .click();
    if (size.name === 'phone') {
      await page.getByTestId('panel-sheet').waitFor();
      await check('editor, values sheet');
      await snap('09-editor-values-sheet');
      await page.getByRole('button', { name: 'Close the panel' }).click();
      await page.getByTestId('panel-sheet').waitFor({ state: 'detached' });
    } else {
      await page.locator('cw-param-panel').waitFor();
    }
    if (size.name !== 'desktop') {
      await page.getByTestId('open-palette').click();
      await page.getByTestId('palette-sheet').waitFor();
      await check('editor, palette sheet');
      await snap('10-editor-palette-sheet');
      await page.getByRole('button', { name: 'Close the stage types' }).click();
      await page.getByTestId('palette-sheet').waitFor({ state: 'detached' });
    }

    // The read-only link: made once, opened signed out at every width.
    if (!shareUrl) {
      await page.getByRole('button', { name: 'Share' }).click();
      const dialog = page.getByRole('dialog');
      await dialog.getByRole('button', { name: 'Make a read-only link' }).click();
      shareUrl = new URL(await dialog.getByTestId('share-url').inputValue()).pathname;
      await check('share dialog');
      await page.keyboard.press('Escape');
    }

    // An L-match entered by design shows the L and C its design chose, in full, on its card.
    await page.goto(matchHref!);
    const match = page.locator('cw-stage-card', {
      has: page.locator('[data-stage-type="l-match"]'),
    });
    await match.locator('[data-param="l"]').waitFor();
    expect(await match.locator('[data-param="l"]').innerText()).toMatch(
      /^Inductance \(designed\)\s+[\d.]+ nH$/,
    );
    expect(await match.locator('[data-param="c"]').innerText()).toMatch(
      /^Capacitance \(designed\)\s+[\d.]+ pF$/,
    );
    await check('editor, designed L-match');
    await snap('10b-editor-designed-match');

    // Compare the example with its lightly loaded sibling.
    const workspace = demoHref!.split('/')[2];
    const ids = [demoHref!, lightHref!].map((href) => href.split('/').pop()).join(',');
    await page.goto(`/w/${workspace}/compare?chains=${ids}`);
    await page.locator('cw-compare table').first().waitFor();
    await check('compare');
    await snap('11-compare');

    await page.goto(`${demoHref}/studies`);
    await page
      .getByRole('heading', { name: /Studies/ })
      .first()
      .waitFor();
    await check('studies');
    await snap('12-studies');

    await page.goto('/account');
    await page.getByRole('heading', { name: 'Number format' }).waitFor();
    const figures = page.getByTestId('significant-figures');
    expect(await figures.inputValue()).toBe('4');
    expect(await page.locator('cw-number-format-card .example').innerText()).toContain('7.235 MHz');
    await figures.selectOption('3');
    expect(await page.locator('cw-number-format-card .example').innerText()).toContain('7.23 MHz');
    await check('account');
    await snap('13-account');

    await page.goto('/admin');
    await page
      .getByRole('heading', { name: /administration/i })
      .first()
      .waitFor();
    await check('admin');
    await snap('14-admin');

    const visitor = await browser.newContext({
      baseURL: BASE_URL,
      viewport: { width: size.width, height: size.height },
    });
    try {
      const v = await visitor.newPage();
      watch(v, problems);
      await v.goto(shareUrl);
      await v.getByTestId('shared-ribbon').waitFor();
      await v.getByRole('heading', { name: LOADING_DEMO }).waitFor();
      await checkScreen(v, `${size.name} share page`, problems);
      await shot(v, `every-screen-${size.name}-15-share-page`);
    } finally {
      await visitor.close();
    }
    void context;
  }
});

function watch(page: Page, problems: string[]): void {
  page.on('pageerror', (error) => problems.push(`page error: ${error.message}`));
  page.on('response', (response) => {
    if (response.status() >= 500)
      problems.push(`server error ${response.status()} on ${response.url()}`);
  });
}

async function tab(page: Page, name: string | RegExp): Promise<void> {
  await page.getByRole('tab', { name }).click();
}

/** Every node column of the budget can be brought into view, and each shows figures. */
async function readBudget(page: Page): Promise<void> {
  const headers = page.locator('cw-budget-table th.node');
  const n = await headers.count();
  expect(n).toBeGreaterThanOrEqual(2);
  const last = headers.nth(n - 1);
  await last.scrollIntoViewIfNeeded();
  await expectInView(last);
  const cells = page.locator('cw-budget-table tr.mat-mdc-row').first().locator('td.value');
  expect(await cells.count()).toBe(n);
  // The quantity names stay in view while the nodes scroll.
  await expectInView(page.locator('cw-budget-table td.quantity').first());
  const text = await page.locator('cw-budget-table').innerText();
  expect(text).toMatch(/\d+(\.\d+)? (k|M|m|µ)?(Ω|V|Hz)/);
}

/** The columns the loading question turns on: loading ratio and downstream share. */
async function readResonators(page: Page): Promise<void> {
  const table = page.locator('cw-resonance-tables section').first();
  for (const heading of ['Loading ratio', 'Downstream share']) {
    const th = table.locator('th', { hasText: heading });
    await th.scrollIntoViewIfNeeded();
    await expectInView(th);
  }
  const row = table.locator('tr.mat-mdc-row').first();
  const cells = await row.locator('td').allInnerTexts();
  expect(cells.length).toBeGreaterThanOrEqual(10);
  expect(cells.join(' ')).toMatch(/×\d|\d %/);
  // The stage column stays in view (sticky) after scrolling right.
  await expectInView(row.locator('td').first());
}

async function expectInView(locator: Locator): Promise<void> {
  const box = await locator.boundingBox();
  expect(box).not.toBeNull();
  const page = locator.page();
  const size = page.viewportSize()!;
  expect(box!.x).toBeGreaterThanOrEqual(-1);
  expect(box!.x + Math.min(box!.width, 40)).toBeLessThanOrEqual(size.width + 1);
}

function count(text: string, word: string): number {
  return text.split(word).length - 1;
}

function escape(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}

/** Runs in the page (it must not call other functions of this file): the focused id. */
function focusedId(): string | null {
  const g = globalThis as unknown as { document: { activeElement: { id: string } | null } };
  return g.document.activeElement?.id ?? null;
}

/** Runs in the page: the text of the focused element. */
function focusedText(): string {
  const g = globalThis as unknown as {
    document: { activeElement: { textContent: string | null } | null };
  };
  return (g.document.activeElement?.textContent ?? '').trim();
}
