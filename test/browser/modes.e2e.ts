/**
 * Modes end to end, against a running server with demo data: the 433.92 MHz transceiver
 * example opens in its receive mode; switching to transmit changes every figure and shows
 * the transmit figures; the transmit caution is on screen in both; a value edited in a mode
 * is that mode's own (marked, and clearable); the two modes compare side by side; the share
 * page offers the modes and the caution.
 */
import type { Browser, Page } from 'playwright-core';
import { BASE_URL, DEMO, launchBrowser, openPage, shot, signIn, type WatchedPage } from './harness';

const TRANSCEIVER = '433.92 MHz low-power transceiver, one antenna for transmit and receive';

/** The toggle of mode `id` in the editor's or share page's mode selector. */
const modeButton = (page: Page, id: string) =>
  page.locator(`[data-testid="mode-selector"] mat-button-toggle[data-mode-id="${id}"] button`);

/** Whether mode `id` is the one selected. */
const modeChosen = (page: Page, id: string) =>
  page
    .locator(`[data-testid="mode-selector"] mat-button-toggle[data-mode-id="${id}"]`)
    .evaluate((el) => el.classList.contains('mat-button-toggle-checked'));

/** The text of a headline figure of the results (summary panel), once shown. */
async function figure(page: Page, key: string): Promise<string> {
  const cell = page.locator(`cw-summary-panel [data-key="${key}"] dd.value`);
  await cell.waitFor();
  return (await cell.innerText()).trim();
}

/** The leading number of a text such as "18.0 dB" or "−3.2 dB" (Unicode minus too). */
const numberOf = (text: string) => Number(/^([-−]?[\d.]+)/.exec(text)?.[1].replace('−', '-'));

/** Polls `read` until `accept` holds (or the time is up, then fails with the last value). */
async function until<T>(
  read: () => Promise<T>,
  accept: (v: T) => boolean,
  ms = 10_000,
): Promise<T> {
  const end = Date.now() + ms;
  let last = await read();
  while (!accept(last) && Date.now() < end) {
    await new Promise((r) => setTimeout(r, 100));
    last = await read();
  }
  if (!accept(last)) throw new Error(`still ${JSON.stringify(last)} after ${ms} ms`);
  return last;
}

/** Waits until no analysis is pending (the progress bar is gone). */
async function settled(page: Page): Promise<void> {
  await page.locator('[aria-label="Analysing the chain"]').waitFor({ state: 'detached' });
}

describe('modes of a chain', () => {
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

  it('should switch between receive and transmit, edit a mode, and compare the modes', async () => {
    const { page } = watched;
    await signIn(page, DEMO.editor, DEMO.password);
    await page.waitForURL(/\/w\/[^/]+\/chains$/);
    await page.getByRole('link', { name: TRANSCEIVER, exact: true }).click();
    await page.waitForURL(/\/chains\/[^/]+$/);

    // It opens in its first mode, receive, with the transmit caution on screen.
    await modeButton(page, 'receive').waitFor();
    await expect(modeChosen(page, 'receive')).resolves.toBe(true);
    const caution = page.locator('cw-caution-banner [data-caution="transmit"]');
    await caution.waitFor();
    await expect(caution.innerText()).resolves.toMatch(/licence/);
    await expect(page.locator('cw-caution-banner').innerText()).resolves.toMatch(
      /Defer to your local codes and to licensed practice/,
    );

    // Receive: the LNA's gain is in the chain's gain; the idle transmit side is a trap that
    // does its job; the transmit-only stages are marked as off this mode's path.
    await settled(page);
    await page.getByRole('tab', { name: 'Summary' }).click();
    const rxGain = numberOf(await figure(page, 'gain'));
    const rxNf = await figure(page, 'nf');
    expect(rxGain).toBeGreaterThan(10);
    const trapRow = page.locator('[data-testid="trap-panel"] tr[data-stage-id="tx-idle"]');
    await expect(trapRow.innerText()).resolves.toContain('does its job');
    await expect(page.locator('[data-testid="transmit-panel"]').count()).resolves.toBe(0);
    await expect(
      page.locator('[data-stage-id="pa-match"] [data-testid="card-mode-note"]').innerText(),
    ).resolves.toContain('Not on the path of “Receive”');
    await shot(page, 'modes-receive');
    // The new stage types get their forms from the catalogue: the branch to ground's parts.
    await page.locator('[data-stage-id="tx-idle"] button.pick').click();
    await page.locator('cw-param-panel h2').filter({ hasText: 'Branch to ground' }).waitFor();
    await shot(page, 'modes-branch-form');

    // Transmit: the figures change, and the transmit figures appear.
    await modeButton(page, 'transmit').click();
    await expect(modeChosen(page, 'transmit')).resolves.toBe(true);
    const txPanel = page.locator('[data-testid="transmit-panel"]');
    await txPanel.waitFor();
    await settled(page);
    const delivered = (await txPanel.locator('[data-key="delivered"] dd').innerText()).trim();
    // 100 mW target from 3 V: what reaches the antenna is the target less the network loss.
    expect(delivered).toMatch(/mW/);
    const mw = numberOf(delivered);
    expect(mw).toBeGreaterThan(50);
    expect(mw).toBeLessThanOrEqual(100.5);
    await expect(txPanel.locator('tr[data-harmonic="2"]').count()).resolves.toBe(1);
    await expect(txPanel.locator('tr[data-harmonic="3"]').count()).resolves.toBe(1);
    await expect(txPanel.locator('[data-key="receiver-input"]').innerText()).resolves.toMatch(
      /dBm · isolation/,
    );
    // Above the tabs, the transmitter's figures replace receive's gain and noise figure.
    expect(await figure(page, 'tx-loss')).toMatch(/dB$/);
    await expect(page.locator('cw-summary-panel [data-key="gain"]').count()).resolves.toBe(0);
    await expect(page.locator('cw-summary-panel [data-key="nf"]').count()).resolves.toBe(0);
    await expect(caution.isVisible()).resolves.toBe(true);
    await expect(
      page.locator('[data-stage-id="lna"] [data-testid="card-mode-note"]').innerText(),
    ).resolves.toContain('Not on the path of “Transmit”');
    await shot(page, 'modes-transmit');

    // An edit in receive is receive's own: marked on the form and the card, and clearable.
    await modeButton(page, 'receive').click();
    // The switch starts a new analysis after a short pause: wait for receive's figure itself
    // rather than for an indicator that may not have appeared yet.
    await page.waitForFunction(
      ([sel, want]) => document.querySelector(sel)?.textContent?.trim() === want,
      ['cw-summary-panel [data-key="nf"] dd.value', rxNf] as const,
      { timeout: 15_000 },
    );
    await settled(page);
    await expect(figure(page, 'nf')).resolves.toBe(rxNf);
    await page.locator('[data-stage-id="lna"] button.pick').click();
    const gainField = page.locator('cw-param-panel input[data-param="gainDb"]');
    await gainField.fill('12');
    await page.locator('[data-testid="override-mark"]').waitFor();
    await expect(
      page.locator('[data-stage-id="lna"] [data-testid="card-mode-note"]').innerText(),
    ).resolves.toContain('1 value set in “Receive”');
    await settled(page);
    const lowered = await until(
      async () => numberOf(await figure(page, 'gain')),
      (g) => Math.abs(g - (rxGain - 6)) < 0.15,
    );
    expect(lowered).toBeCloseTo(rxGain - 6, 0);
    await shot(page, 'modes-receive-override');
    await page.locator('[data-testid="override-mark"] button.clear').click();
    // The page redraws after the click (signals, not a synchronous pass): wait for the mark to go.
    await page.locator('[data-testid="override-mark"]').waitFor({ state: 'detached' });
    await expect(gainField.inputValue()).resolves.toMatch(/^18/);
    await settled(page);
    await until(
      async () => numberOf(await figure(page, 'gain')),
      (g) => Math.abs(g - rxGain) < 0.05,
    );

    // The saved chain's two modes, side by side.
    await page.getByTestId('compare-modes').click();
    await page.waitForURL(/\/compare\?chains=/);
    await page.locator('tr[data-row] td').first().waitFor();
    const heads = page.locator('table[aria-label="Key figures of each variant"] thead th.variant');
    const names = await until(
      async () => (await heads.allInnerTexts()).map((t) => t.split('\n')[0].trim()),
      (n) => n.length === 2,
    );
    expect(names).toEqual([`${TRANSCEIVER} · Receive`, `${TRANSCEIVER} · Transmit`]);
    await expect(page.locator('h1').innerText()).resolves.toBe('Compare modes and variants');
    // The modes differ in their stages: the comparison lists what differs.
    await page.getByTestId('stage-diff').waitFor();
    // Nothing on the way was refused (a mode's column is read as its chain).
    await expect(page.locator('simple-snack-bar').count()).resolves.toBe(0);
    await shot(page, 'modes-compare');
  });

  it('should show the modes and the transmit caution on a share page', async () => {
    const { page } = watched;
    await signIn(page, DEMO.editor, DEMO.password);
    await page.waitForURL(/\/w\/[^/]+\/chains$/);
    await page.getByRole('link', { name: TRANSCEIVER, exact: true }).click();
    await page.waitForURL(/\/chains\/[^/]+$/);
    const chainId = /\/chains\/([^/]+)$/.exec(page.url())![1];
    const made = await page.evaluate(async (id) => {
      const csrf = await (await fetch('/api/auth/csrf')).json();
      const res = await fetch(`/api/chains/${id}/share-links`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', 'x-csrf-token': csrf.token },
        body: '{}',
      });
      return { status: res.status, body: await res.json() };
    }, chainId);
    expect(made.status).toBe(201);
    const path = new URL(made.body.url).pathname;

    const visitor = await browser.newContext();
    try {
      const shared = await visitor.newPage();
      await shared.goto(`${BASE_URL}${path}`);
      await shared.locator('cw-caution-banner [data-caution="transmit"]').waitFor();
      await modeButton(shared, 'transmit').click();
      await shared.locator('[data-testid="transmit-panel"]').waitFor();
      const netlist = shared.getByRole('link', { name: 'SPICE netlist' });
      await expect(netlist.getAttribute('href')).resolves.toMatch(/mode=transmit$/);
      await shot(shared, 'modes-share-transmit');
    } finally {
      await visitor.close();
    }
  });
});
