/**
 * Studies end to end, against a running server with demo data and a study worker: from the
 * editor's Studies button, a Monte Carlo run whose progress bar moves and which is cancelled,
 * another whose histograms and yield are read, a band study, and the optimiser whose result
 * is saved as a variant.
 */
import type { Browser, Page } from 'playwright-core';
import {
  DEMO,
  launchBrowser,
  openPage,
  shot,
  signIn,
  uniqueSuffix,
  type WatchedPage,
} from './harness';

/** A chain of the test's own from the shortwave example, with targets and a short sweep. */
async function makeChain(page: Page, wid: string): Promise<string> {
  const csrf = (await (await page.request.get('/api/auth/csrf')).json()).token as string;
  const headers = { 'x-csrf-token': csrf };
  const created = await page.request.post(`/api/workspaces/${wid}/chains`, {
    headers,
    data: { fromExample: 'shortwave-superhet-single-tank', name: `Studies ${uniqueSuffix()}` },
  });
  expect(created.status()).toBe(201);
  const chain = await created.json();
  const doc = chain.document;
  doc.settings.sweep = { startHz: 6e6, stopHz: 9e6, points: 201, scale: 'lin' };
  doc.settings.targets = { centreMinHz: 7.1e6, centreMaxHz: 7.3e6, maxNoiseFigureDb: 5 };
  const tank = doc.stages.find((s: { id: string }) => s.id === 'preselector');
  tank.tolerances = { c: 3, l: 2 };
  const saved = await page.request.put(`/api/chains/${chain.id}`, {
    headers,
    data: { version: chain.version, document: doc, message: 'targets for studies' },
  });
  expect(saved.status()).toBe(200);
  return chain.id;
}

const run = (page: Page, kind: string) =>
  page.locator(`tr[data-testid="study-run"][data-kind="${kind}"]`).first();

async function fractionOf(page: Page, kind: string): Promise<number> {
  return Number(await run(page, kind).locator('mat-progress-bar').getAttribute('data-fraction'));
}

async function waitDone(page: Page, kind: string): Promise<void> {
  await page
    .locator(`tr[data-testid="study-run"][data-kind="${kind}"][data-status="done"]`)
    .first()
    .waitFor({ timeout: 180_000 });
}

describe('studies', () => {
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

  it('runs, follows and cancels studies, and saves the optimised chain as a variant', async () => {
    const { page } = watched;
    await signIn(page, DEMO.editor, DEMO.password);
    await page.waitForURL(/\/w\/[^/]+\/chains$/);
    const wid = /\/w\/([^/]+)\//.exec(page.url())![1];
    const chainId = await makeChain(page, wid);
    await page.goto(`/w/${wid}/chains/${chainId}`);
    await page.getByTestId('open-studies').click();
    await page.waitForURL(/\/studies$/);

    // A long Monte Carlo run: its bar moves, then it is cancelled.
    await page.getByTestId('mc-distribution').selectOption('uniform');
    await page.getByTestId('mc-trials').fill('10000');
    await page.getByTestId('run-mc').click();
    await page.waitForFunction(
      () =>
        Number(
          (
            globalThis as unknown as {
              document: { querySelector(s: string): { getAttribute(a: string): string } | null };
            }
          ).document
            .querySelector('tr[data-kind="monte-carlo"] mat-progress-bar')
            ?.getAttribute('data-fraction') ?? 0,
        ) > 0,
      undefined,
      { timeout: 120_000 },
    );
    const first = await fractionOf(page, 'monte-carlo');
    await page.waitForFunction(
      (was) =>
        Number(
          (
            globalThis as unknown as {
              document: { querySelector(s: string): { getAttribute(a: string): string } | null };
            }
          ).document
            .querySelector('tr[data-kind="monte-carlo"] mat-progress-bar')
            ?.getAttribute('data-fraction') ?? 0,
        ) > was,
      first,
      { timeout: 60_000 },
    );
    expect(await fractionOf(page, 'monte-carlo')).toBeGreaterThan(first);
    await shot(page, 'studies-mc-running');
    await run(page, 'monte-carlo').getByTestId('cancel-study').click();
    await page
      .locator('tr[data-kind="monte-carlo"][data-status="cancelled"]')
      .first()
      .waitFor({ timeout: 10_000 });

    // A short one to the end: histograms and the yield.
    await page.getByTestId('mc-trials').fill('200');
    await page.getByTestId('run-mc').click();
    await page.locator('tr[data-kind="monte-carlo"]').nth(1).waitFor();
    await waitDone(page, 'monte-carlo');
    await run(page, 'monte-carlo').getByTestId('open-study').click();
    const yieldText = await page.getByTestId('mc-yield').innerText();
    const percent = Number(/Yield: ([\d.]+) %/.exec(yieldText)?.[1]);
    expect(percent).toBeGreaterThan(0);
    expect(percent).toBeLessThanOrEqual(100);
    await page
      .getByRole('button', { name: 'Save PNG' })
      .first()
      .and(page.locator(':enabled'))
      .waitFor();
    expect(await page.getByTestId('mc-figure').locator('option').count()).toBeGreaterThan(5);
    await shot(page, 'studies-mc-result');

    // The band study.
    await page.getByRole('tab', { name: 'Band tracking' }).click();
    await page.getByTestId('band-stage').selectOption('preselector');
    await page.getByTestId('band-min').fill('150');
    await page.getByTestId('band-max').fill('330');
    await page.getByTestId('band-positions').fill('11');
    await page.getByTestId('run-band').click();
    await waitDone(page, 'band');
    await run(page, 'band').getByTestId('open-study').click();
    await expect(page.getByTestId('band-summary').innerText()).resolves.toMatch(
      /worst tracking error/,
    );
    await shot(page, 'studies-band-result');

    // The optimiser, and its result kept as a variant.
    await page.getByRole('tab', { name: 'Optimiser' }).click();
    await page.getByTestId('opt-stage').selectOption('preselector');
    await page.getByTestId('opt-min').fill('1e-10');
    await page.getByTestId('opt-max').fill('5e-10');
    await page.getByTestId('opt-goal-stage').selectOption('preselector');
    await page.getByTestId('opt-target').fill('7.3');
    await page.getByTestId('run-opt').click();
    await waitDone(page, 'optimiser');
    await run(page, 'optimiser').getByTestId('open-study').click();
    const after = Number(
      (await page.getByTestId('opt-after').first().innerText()).replace(/,/g, ''),
    );
    // 2.2 µH resonating at 7.3 MHz: C = 1/((2π·7.3 MHz)²·2.2 µH) ≈ 216 pF, less what the
    // stages around it add; the optimiser lands close to it.
    expect(after).toBeGreaterThan(180e-12);
    expect(after).toBeLessThan(222e-12);
    await shot(page, 'studies-optimiser-result');
    await page.getByTestId('save-variant').click();
    await page.waitForURL(
      (url) => /\/chains\/[^/]+$/.test(url.pathname) && !url.pathname.endsWith(chainId),
    );
    await page.getByText('(optimised)').first().waitFor();
  });
});
