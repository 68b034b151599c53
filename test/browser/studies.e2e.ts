/**
 * Studies end to end, against a running server with demo data and a study worker: the yield
 * targets typed into the editor's Chain panel and the preselector's capacitor marked variable
 * in its Stage panel; from the editor's Studies button, a Monte Carlo run whose progress bar
 * moves and which is cancelled, another whose histograms and yield are read, a band study
 * that turns the chain's marked gang with nothing typed on the studies page, and the
 * optimiser with two values and two weighted goals whose result is saved as a variant.
 */
import type { Browser, Locator, Page } from 'playwright-core';
import { parseQuantity } from '../../shared/units';
import {
  DEMO,
  launchBrowser,
  openPage,
  shot,
  signIn,
  uniqueSuffix,
  type WatchedPage,
} from './harness';

/** A chain of the test's own from the shortwave example, with tolerances and a short sweep. */
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
  const tank = doc.stages.find((s: { id: string }) => s.id === 'preselector');
  tank.tolerances = { c: 3, l: 2 };
  const saved = await page.request.put(`/api/chains/${chain.id}`, {
    headers,
    data: { version: chain.version, document: doc, message: 'targets for studies' },
  });
  expect(saved.status()).toBe(200);
  return chain.id;
}

/** Types into a field that reads its value on change (blur). */
async function change(field: Locator, text: string): Promise<void> {
  await field.fill(text);
  await field.press('Tab');
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

    // The preselector's capacitor marked variable, 150 … 330 pF, in its Stage panel.
    await page.getByRole('button', { name: 'Select Preselector tank' }).click();
    const mark = page.locator('[data-variable="c"]');
    await mark.getByTestId('variable-toggle').check();
    await change(mark.getByTestId('variable-min'), '150 pF');
    await change(mark.getByTestId('variable-max'), '330 pF');
    await shot(page, 'studies-editor-variable-mark');
    // The yield targets, typed into the Chain panel.
    await page
      .getByRole('radio', { name: 'Chain', exact: true })
      .or(page.getByRole('button', { name: 'Chain', exact: true }))
      .first()
      .click();
    await page.getByTestId('targets-form').locator('summary').click();
    await change(page.locator('input[data-target="centreMinHz"]'), '7.1 MHz');
    await change(page.locator('input[data-target="centreMaxHz"]'), '7.3 MHz');
    await change(page.locator('input[data-target="maxNoiseFigureDb"]'), '5 dB');
    await page.getByTestId('targets-form').scrollIntoViewIfNeeded();
    await shot(page, 'studies-editor-targets');
    const saved = page.waitForResponse((r) => r.url().endsWith(`/api/chains/${chainId}`) && r.request().method() === 'PUT'); // prettier-ignore
    await page.getByRole('button', { name: 'Save', exact: true }).click();
    const put = await saved;
    expect(put.status()).toBe(200);
    // Read back from the server: the page may have moved on by the time the body is read.
    const reread = await page.request.get(`/api/chains/${chainId}`);
    expect(reread.status()).toBe(200);
    const stored = (await reread.json()).document.settings;
    expect(stored.targets).toEqual({ centreMinHz: 7.1e6, centreMaxHz: 7.3e6, maxNoiseFigureDb: 5 });
    expect(stored.variables).toEqual([{ stageId: 'preselector', key: 'c', min: 150e-12, max: 330e-12 }]); // prettier-ignore

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

    // The band study turns the gang marked on the chain: nothing to type but the positions.
    await page.getByRole('tab', { name: 'Band tracking' }).click();
    expect(await page.getByTestId('band-source').locator('option:checked').innerText()).toMatch(
      /marked on the chain: main \(preselector\.c 150 pF…330 pF\)/,
    );
    await page.getByTestId('band-positions').fill('11');
    await page.getByTestId('run-band').click();
    await waitDone(page, 'band');
    await run(page, 'band').getByTestId('open-study').click();
    await expect(page.getByTestId('band-summary').innerText()).resolves.toMatch(
      /worst tracking error/,
    );
    await shot(page, 'studies-band-result');

    // The optimiser: the tank's C and L, a resonance goal and a weighted noise-figure goal;
    // its result kept as a variant.
    await page.getByRole('tab', { name: 'Optimiser' }).click();
    const vars = page.getByTestId('opt-variable');
    await vars.nth(0).getByTestId('opt-stage').selectOption('preselector');
    await vars.nth(0).getByTestId('opt-key').selectOption('c');
    await vars.nth(0).getByTestId('opt-min').fill('100 pF');
    await vars.nth(0).getByTestId('opt-max').fill('500 pF');
    await page.getByTestId('opt-add-variable').click();
    await vars.nth(1).getByTestId('opt-stage').selectOption('preselector');
    await vars.nth(1).getByTestId('opt-key').selectOption('l');
    await vars.nth(1).getByTestId('opt-min').fill('2 uH');
    await vars.nth(1).getByTestId('opt-max').fill('2.4 uH');
    const goals = page.getByTestId('opt-goal');
    await goals.nth(0).getByTestId('opt-goal-stage').selectOption('preselector');
    await goals.nth(0).getByTestId('opt-target').fill('7.3 MHz');
    await goals.nth(0).getByTestId('opt-goal-weight').fill('10');
    await page.getByTestId('opt-add-goal').click();
    await goals.nth(1).getByTestId('opt-goal-kind').selectOption('noise-figure');
    await goals.nth(1).getByTestId('opt-goal-db').fill('10');
    await shot(page, 'studies-optimiser-form');
    await page.getByTestId('run-opt').click();
    await waitDone(page, 'optimiser');
    await run(page, 'optimiser').getByTestId('open-study').click();
    await page.getByTestId('opt-result').waitFor();
    expect(await page.getByTestId('opt-goal-row').count()).toBe(2);
    expect(await page.getByTestId('opt-after').count()).toBe(2);
    // The values are written with their unit and prefix ("234.5 pF"), as the editor writes them.
    const read = async (i: number, kind: 'farad' | 'henry') => {
      const parsed = parseQuantity(await page.getByTestId('opt-after').nth(i).innerText(), kind);
      return parsed.ok ? parsed.value : NaN;
    };
    const after = await read(0, 'farad');
    const afterL = await read(1, 'henry');
    expect(afterL).toBeGreaterThanOrEqual(2e-6);
    expect(afterL).toBeLessThanOrEqual(2.4e-6);
    // Resonating at 7.3 MHz: L·C = 1/(2π·7.3 MHz)² ≈ 4.75e-16 (Thomson, common practice),
    // less what the stages around the tank add; the optimiser lands close to it.
    expect(after * afterL).toBeGreaterThan(4.0e-16);
    expect(after * afterL).toBeLessThan(4.9e-16);
    await shot(page, 'studies-optimiser-result');
    await page.getByTestId('save-variant').click();
    await page.waitForURL(
      (url) => /\/chains\/[^/]+$/.test(url.pathname) && !url.pathname.endsWith(chainId),
    );
    await page.getByText('(optimised)').first().waitFor();
  });
});
