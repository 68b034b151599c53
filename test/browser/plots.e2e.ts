/**
 * Plots open fast and follow edits fast, on the two-metre demo chain at 2,001 points. Two
 * figures for the bench, timed from the browser's event to the painted plot
 * (helpers/plot-probe.ts): the click on the Plots tab → the first plot's traces
 * (test-results/first-plot.json), and an edit of a value with the plots open → the step-up
 * plot redrawn (test-results/edit-to-plot.json). Medians of several; never asserted, as a
 * shared machine would only measure its load. Also checks that the client's scripts travel
 * compressed.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { BASE_URL, DEMO, launchBrowser, openPage, shot, signIn, type WatchedPage } from './harness';
import { armPlotProbe, medianOf, readPlotProbe } from './helpers/plot-probe';
import { card, fieldOf, param, settled } from './helpers/strip';
import { expectText, waitUntil } from './helpers/wait';

const CHAIN = 'Two-metre receiver, coupled preselector ahead of the LNA';
const OPENINGS = 7;
const FIRST_PLOT_TARGET_MS = 400;
const EDITS = 9;
const EDIT_TARGET_MS = 100;
/** Source resistances typed in turn, Ω: each moves every trace of the step-up plot. */
const EDIT_OHMS = [62, 50, 75];
/** Step-up, input impedance, return loss and the impedance chart. */
const PLOT_COUNT = 4;

describe('plots', () => {
  let browser: Browser;
  let watched: WatchedPage;

  beforeAll(async () => {
    browser = await launchBrowser();
    watched = await openPage(browser);
  });
  afterAll(async () => {
    await watched?.context.close();
    await browser?.close();
  });

  it('should serve the client scripts compressed', async () => {
    const { page } = watched;
    await page.goto('/sign-in');
    const scripts: string[] = await page.evaluate(() =>
      Array.from(
        (
          globalThis as unknown as {
            document: { querySelectorAll(s: string): ArrayLike<{ src: string }> };
          }
        ).document.querySelectorAll('script[src]'),
        (s) => s.src,
      ),
    );
    expect(scripts.length).toBeGreaterThan(0);
    for (const src of scripts) {
      const res = await page.request.get(src, { headers: { 'accept-encoding': 'br, gzip' } });
      expect(res.status()).toBe(200);
      expect(['br', 'gzip']).toContain(res.headers()['content-encoding']);
    }
  });

  it('should draw the first plot soon after the Plots tab opens, and redraw it soon after an edit', async () => {
    const { page } = watched;
    await signIn(page, DEMO.editor, DEMO.password);
    await page.waitForURL(/\/w\/[^/]+\/chains$/);
    await page.getByRole('link', { name: CHAIN }).first().click();
    await page.waitForURL(/\/chains\/[^/]+$/);
    await page.getByRole('tab', { name: 'Plots' }).waitFor({ timeout: 60000 });
    // The library was fetched while the page was idle.
    await page.waitForFunction(
      () => performance.getEntriesByName('cw-plotting-ready', 'mark').length > 0,
      undefined,
      { timeout: 60000 },
    );

    // Click on the tab → the step-up plot's traces painted, each opening from the Budget tab.
    const opening: number[] = [];
    for (let i = 0; i < OPENINGS; i++) {
      await armPlotProbe(page, 'click');
      await page.getByRole('tab', { name: 'Plots' }).click();
      opening.push(await readPlotProbe(page));
      if (i === 0) await shot(page, 'plots-01-first-plot');
      await page.getByRole('tab', { name: 'Budget' }).click();
      // The next opening must draw new plots: a probe armed while the old ones were still on
      // the page, with a tab switch there and back in one change detection, saw no drawing.
      await waitUntil(
        async () => (await page.locator('cw-result-plot').count()) === 0,
        'the Plots tab to close',
      );
    }
    record('first-plot.json', opening, FIRST_PLOT_TARGET_MS, 'click on Plots → first plot');

    // Edits of the source resistance with the plots open: input event → step-up plot redrawn.
    await page.getByRole('tab', { name: 'Plots' }).click();
    await settledPlots(page);
    await card(page, 0)
      .getByRole('button', { name: /^Select / })
      .click();
    const editing: number[] = [];
    for (let i = 0; i < EDITS; i++) {
      const ohms = EDIT_OHMS[i % EDIT_OHMS.length];
      await armPlotProbe(page, 'input');
      await param(page, 'r').fill(`${ohms}`);
      editing.push(await readPlotProbe(page));
      await expectText(fieldOf(page, 'r').locator('output'), `= ${ohms} Ω`);
      // Separate edits, as a person makes them: the next starts once this one is drawn.
      await settledPlots(page);
    }
    await shot(page, 'plots-02-after-edits');
    record('edit-to-plot.json', editing, EDIT_TARGET_MS, 'edit → step-up plot redrawn');
    expect(opening).toHaveLength(OPENINGS);
    expect(editing).toHaveLength(EDITS);
    expect(watched.problems).toEqual([]);
  });
});

/**
 * Waits until no analysis is in flight and every plot on the tab has drawn its newest figure
 * (a plot is `aria-busy` until then): an edit made while a plot below is still drawing the
 * last answer would be timed against that drawing.
 */
async function settledPlots(page: Page): Promise<void> {
  await settled(page);
  await waitUntil(
    async () =>
      (await page.locator('cw-result-plot').count()) === PLOT_COUNT &&
      (await page.locator('cw-result-plot .main-svg').count()) >= PLOT_COUNT &&
      (await page.locator('cw-result-plot [aria-busy="true"]').count()) === 0,
    'every plot drawn',
  );
}

/** Writes one figure's samples and the load average for the bench (test-results/<file>). */
function record(file: string, samples: number[], targetMs: number, what: string): void {
  const median = medianOf(samples);
  mkdirSync(join(process.cwd(), 'test-results'), { recursive: true });
  writeFileSync(
    join(process.cwd(), 'test-results', file),
    JSON.stringify(
      {
        what,
        medianMs: median,
        samplesMs: samples,
        targetMs,
        load: loadavg()[0],
        baseUrl: BASE_URL,
        measuredAt: new Date().toISOString(),
      },
      null,
      2,
    ),
  );
  console.log(`${what} over ${samples.length}: median ${median} ms (${samples.join(', ')})`);
}
