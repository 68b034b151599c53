/**
 * Comparing variants end to end, against a running server with demo data: from the
 * editor's "Compare variants" button to a table with one column per variant, the image
 * rejection row with its best value marked, the overlaid plots, and the family picker.
 */
import type { Browser, Page } from 'playwright-core';
import { DEMO, launchBrowser, openPage, shot, signIn, type WatchedPage } from './harness';
import { waitUntil } from './helpers/wait';

const SINGLE = 'Shortwave superhet, 7.2 MHz, one preselector tank';
const PAIR = 'Shortwave superhet, 7.2 MHz, coupled-pair preselector';

/** The texts of the image-rejection row's value cells. */
async function imageRow(page: Page): Promise<{ texts: string[]; best: boolean[] }> {
  const cells = page.locator('tr[data-row="image"] td');
  const texts = (await cells.allInnerTexts()).map((t) => t.replace(/\s+/g, ' ').trim());
  const best = await cells.evaluateAll((tds) => tds.map((td) => td.classList.contains('best')));
  return { texts, best };
}

/** Waits until both plots are drawn (their PNG buttons are enabled once a plot is ready). */
async function plotsReady(page: Page): Promise<void> {
  const ready = page.getByRole('button', { name: 'Save PNG' }).and(page.locator(':enabled'));
  await ready.nth(1).waitFor();
}

/** A frequency tick as ours are written: a space, then the prefix and unit ("7.25 MHz"). */
const TICK = /^\d+(\.\d+)? [kM]?Hz$/;

/**
 * Zooms into the middle fifth of the step-up plot: its frequency axis is ticked again with
 * our prefixes for the range shown (labels the whole sweep's ticks never had). Then hovers
 * it: the heading of the hover box is the frequency written as every figure is, at the
 * default 4 significant figures with a space before the unit ("7.200 MHz", not Plotly's
 * "7.2MHz"), and stays so while the pointer moves over the same point.
 */
async function zoomAndHover(page: Page): Promise<void> {
  const plot = page.locator('[role="group"][aria-label^="Voltage step-up at the last node"]');
  const ticks = () => plot.locator('.xtick text').allTextContents();
  const before = await ticks();
  expect(before.length).toBeGreaterThanOrEqual(3);
  for (const t of before) expect([t, TICK.test(t)]).toEqual([t, true]);
  // The pointer works in the viewport: bring the plot into it first.
  await plot.scrollIntoViewIfNeeded();
  const area = (await plot.locator('.nsewdrag').first().boundingBox())!;
  const y = area.y + area.height / 2;
  await page.mouse.move(area.x + area.width * 0.4, y);
  await page.mouse.down();
  await page.mouse.move(area.x + area.width * 0.6, y, { steps: 8 });
  await page.mouse.up();
  let after: string[] = [];
  await waitUntil(async () => {
    after = await ticks();
    return after.length >= 3 && after.some((t) => !before.includes(t));
  }, 'the frequency ticks worked out again for the zoomed range');
  for (const t of after) expect([t, TICK.test(t)]).toEqual([t, true]);
  // The window only: a full-page shot resizes the window, which moves the plot and ends a hover.
  await shot(page, 'compare-03-zoomed', { fullPage: false });

  const heading = plot.locator('.hoverlayer .legendtitletext');
  await page.mouse.move(area.x + area.width * 0.5, y);
  await waitUntil(async () => /^\d\.\d{3} MHz$/.test((await heading.textContent()) ?? ''), 'our hover heading'); // prettier-ignore
  await page.mouse.move(area.x + area.width * 0.5 + 1, y + 2);
  await waitUntil(async () => /^\d\.\d{3} MHz$/.test((await heading.textContent()) ?? ''), 'the heading after a move'); // prettier-ignore
  await shot(page, 'compare-04-hover', { fullPage: false });
  // A double-click resets the zoom and brings back the whole sweep's ticks.
  await page.mouse.dblclick(area.x + area.width * 0.5, y);
  await waitUntil(async () => (await ticks()).join() === before.join(), 'the ticks of the sweep');
}

/** The number (dB) at the start of a cell text such as "32.5 dB best". */
const decibelsOf = (text: string) => Number(/^(-?[\d.]+) dB/.exec(text)?.[1] ?? NaN);

describe('compare variants', () => {
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

  it('should open from the editor and put the variants side by side', async () => {
    const { page } = watched;
    await signIn(page, DEMO.editor, DEMO.password);
    await page.waitForURL(/\/w\/[^/]+\/chains$/);
    await page.getByRole('link', { name: SINGLE, exact: true }).click();
    await page.waitForURL(/\/chains\/[^/]+$/);

    const button = page.getByTestId('compare-variants');
    await button.waitFor();
    await button.click();
    await page.waitForURL(/\/compare\?chains=/);

    // One column per variant, named after the chains.
    const heads = page.locator('table[aria-label="Key figures of each variant"] thead th.variant');
    await page.locator('tr[data-row="image"] td').first().waitFor();
    expect((await heads.allInnerTexts()).map((t) => t.split('\n')[0].trim())).toEqual([
      SINGLE,
      PAIR,
    ]);

    // The coupled pair rejects the image better, and only its cell is marked.
    const image = await imageRow(page);
    expect(image.texts).toHaveLength(2);
    const [single, pair] = image.texts.map(decibelsOf);
    expect(single).toBeGreaterThan(10);
    expect(single).toBeLessThan(18);
    expect(pair).toBeGreaterThan(28);
    expect(pair).toBeLessThan(36);
    expect(image.best).toEqual([false, true]);
    await expect(page.locator('tr[data-row="image"] th').innerText()).resolves.toContain(
      'higher is better',
    );

    // Both plots are drawn with one trace per variant.
    for (const label of ['Voltage step-up at the last node', 'Input return loss']) {
      const plot = page.locator(`[role="group"][aria-label^="${label}"]`);
      await plot.locator('.main-svg').first().waitFor();
      expect(await plot.locator('.scatterlayer .trace').count()).toBe(2);
    }
    await plotsReady(page);
    await shot(page, 'compare-01-two-variants');
    await zoomAndHover(page);

    // Taking one variant away leaves one column; the picker brings it back.
    await page.getByRole('button', { name: `Stop comparing ${PAIR}` }).click();
    await page.waitForURL((url) => url.searchParams.get('chains')?.split(',').length === 1);
    await page.waitForFunction(
      () =>
        (
          globalThis as unknown as { document: { querySelectorAll(s: string): { length: number } } }
        ).document.querySelectorAll('table.grid thead th.variant').length === 1,
    );
    await page.getByTestId('compare-picker').click();
    await page.getByRole('option', { name: PAIR }).click();
    await page.keyboard.press('Escape');
    await page.waitForURL((url) => url.searchParams.get('chains')?.split(',').length === 2);
    await page.waitForFunction(
      () =>
        (
          globalThis as unknown as { document: { querySelectorAll(s: string): { length: number } } }
        ).document.querySelectorAll('tr[data-row="image"] td').length === 2,
    );
    expect((await heads.allInnerTexts()).map((t) => t.split('\n')[0].trim())).toEqual([
      SINGLE,
      PAIR,
    ]);
  });

  it('should let a viewer compare from the chain list', async () => {
    const { page } = watched;
    await signIn(page, DEMO.viewer, DEMO.password);
    await page.waitForURL(/\/w\/[^/]+\/chains$/);
    await page.getByRole('button', { name: `Actions for ${PAIR}` }).click();
    await page.getByRole('menuitem', { name: 'Compare with its variants' }).click();
    await page.waitForURL(/\/compare\?chains=/);
    await page.locator('tr[data-row="image"] td').nth(1).waitFor();
    const image = await imageRow(page);
    expect(image.best).toEqual([false, true]);
    await plotsReady(page);
    await shot(page, 'compare-02-viewer');
  });
});
