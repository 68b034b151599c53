/**
 * One number format everywhere, in the browser: the account page's significant figures set
 * to 3 and then to 6, and the same quantities read at each setting on the editor (headline
 * figures, a budget cell, the resonator table, the echo under a value field, a flag
 * sentence the server writes), the receiver plan and a band study's result. At 3 figures no figure has more than three; at 6 the
 * same quantities show more, and round back to what 3 figures showed. Screenshots go to
 * test-results/screenshots/number-format-*.png.
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

/** Significant digits written in a figure's number: "−0.0123 dB" → 3, "1.151 nF" → 4. */
function digitsOf(text: string): number {
  const number = /[-−]?\d[\d.]*(e[-+]?\d+)?/.exec(text.replace(/,/g, ''))?.[0] ?? '';
  const mantissa = number.replace(/^[-−]/, '').replace(/e.*$/, '').replace('.', '');
  return mantissa.replace(/^0+/, '').length;
}

/** The number a figure reads as, in its unit's SI value ("2.35 kΩ" → 2350). */
function valueOf(text: string): number {
  const cleaned = text.replace(/−/g, '-').replace(/^=\s*/, '').trim();
  for (const kind of ['hertz', 'ohm', 'farad', 'henry', 'volt'] as const) {
    const parsed = parseQuantity(cleaned, kind);
    if (parsed.ok) return parsed.value;
  }
  return Number(/-?\d[\d.]*(e[-+]?\d+)?/.exec(cleaned)?.[0]);
}

/** Waits until `locator`'s text matches `pattern` (bounded polling), and returns it. */
async function textWhen(locator: Locator, pattern: RegExp, what: string): Promise<string> {
  const deadline = Date.now() + 20_000;
  let last = '';
  while (Date.now() < deadline) {
    last = ((await locator.first().textContent()) ?? '').replace(/\s+/g, ' ').trim();
    if (pattern.test(last)) return last;
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  throw new Error(`${what}: still "${last}" after 20 s (wanted ${pattern})`);
}

async function setFigures(page: Page, figures: number): Promise<void> {
  await page.goto('/account');
  await page.getByRole('heading', { name: 'Number format' }).waitFor();
  const select = page.getByTestId('significant-figures');
  await select.selectOption(String(figures));
  expect(await select.inputValue()).toBe(String(figures));
}

/** Calls the API as the signed-in user of `page` (session cookie and its CSRF token). */
async function csrfHeaders(page: Page): Promise<Record<string, string>> {
  const csrf = (await (await page.request.get('/api/auth/csrf')).json()).token as string;
  return { 'x-csrf-token': csrf };
}

/** A chain of the test's own from an example (the shortwave one); returns its id and document. */
async function newChain(
  page: Page,
  wid: string,
  what: string,
  fromExample = 'shortwave-superhet-single-tank',
) {
  const created = await page.request.post(`/api/workspaces/${wid}/chains`, {
    headers: await csrfHeaders(page),
    data: { fromExample, name: `${what} ${uniqueSuffix()}` },
  });
  expect(created.status()).toBe(201);
  return created.json();
}

/** The chain read at both settings: its tuning capacitor marked and a band study run. */
async function chainToRead(page: Page, wid: string): Promise<string> {
  const chain = await newChain(page, wid, 'Figures');
  const doc = chain.document;
  doc.settings.variables = [{ stageId: 'preselector', key: 'c', min: 150e-12, max: 330e-12 }];
  const headers = await csrfHeaders(page);
  const saved = await page.request.put(`/api/chains/${chain.id}`, {
    headers,
    data: { version: chain.version, document: doc, message: 'tuning capacitor marked' },
  });
  expect(saved.status()).toBe(200);
  const study = await page.request.post(`/api/chains/${chain.id}/studies`, {
    headers,
    // An oscillator section with its own coil and no padder: the tank tracks the dial
    // only roughly, so the worst tracking error is a figure of many digits.
    data: {
      kind: 'band',
      positions: 5,
      points: 101,
      oscillator: { l: 1.95e-6, trimmer: 0, padder: 0 },
    },
  });
  expect(study.status()).toBeLessThan(300);
  return chain.id;
}

/**
 * The echo under a value field: a capacitance typed as arithmetic into a fresh chain of
 * its own (so the chain read for the other figures is never edited), then saved.
 */
async function echoAt(page: Page, wid: string): Promise<string> {
  const chain = await newChain(page, wid, 'Echo');
  await page.goto(`/w/${wid}/chains/${chain.id}`);
  const tank = page.locator('cw-stage-strip .slot').filter({ hasText: 'Preselector tank' });
  await tank
    .getByRole('button', { name: /^Select / })
    .first()
    .click();
  await page.locator('cw-param-panel input[data-param="c"]').fill('1/((2*pi*7.2 MHz)^2*2.2 uH)');
  const echo = await textWhen(
    page.locator('cw-param-panel output.read').filter({ hasText: 'F' }),
    /= [\d.]+ pF/,
    'the capacitance echo',
  );
  await page.getByRole('button', { name: 'Save', exact: true }).click();
  await textWhen(page.locator('.chip'), /Saved/, 'the save');
  return echo;
}

/**
 * The detector's level in the under-driven detector's flag sentence ("gets 134 µV peak"),
 * from a fresh chain of the long-wave loop example (its detector is under-driven), read on
 * the editor's Flags tab.
 */
async function flagAt(page: Page, wid: string, figures: number): Promise<string> {
  const chain = await newChain(page, wid, 'Flag', 'longwave-time-signal-loop');
  await page.goto(`/w/${wid}/chains/${chain.id}`);
  await page.getByRole('tab', { name: /^Flags/ }).click();
  const sentence = await textWhen(
    page.locator('cw-flags-list li').filter({ hasText: 'peak it needs' }),
    /gets [\d.]+ [µm]?V peak/,
    'the under-driven detector flag',
  );
  await shot(page, `number-format-${figures}-flags`);
  return /gets ([\d.]+ [µm]?V) peak/.exec(sentence)![1];
}

interface Reading {
  /** A figure of a flag sentence, which the server writes at the user's figures. */
  flag: string;
  headline: string;
  budget: string;
  loadedQ: string;
  bandwidth: string;
  echo: string;
  plan: string;
  band: string;
}

/** The quantities read at one setting, from the editor, its Plan tab and the studies page. */
async function readAll(
  page: Page,
  wid: string,
  chainId: string,
  figures: number,
): Promise<Reading> {
  const editorUrl = `/w/${wid}/chains/${chainId}`;
  const flag = await flagAt(page, wid, figures);
  const echo = await echoAt(page, wid);
  await page.goto(editorUrl);
  const headline = page.locator('.headline-value');
  await headline.first().waitFor();
  const headlineText = await textWhen(headline, /\d/, 'the first headline figure');
  const budgetRow = page
    .getByRole('region', { name: 'Budget by node' })
    .getByRole('row', { name: /Z looking in \|Z\|/ });
  const budget = await textWhen(budgetRow.locator('td.value').last(), /Ω/, 'the |Z| cell');

  await page.getByRole('tab', { name: 'Resonators & selectivity' }).click();
  const loadedQ = await textWhen(page.locator('td.mat-column-loadedQ'), /\d/, 'the loaded Q');
  const bandwidth = await textWhen(page.locator('td.mat-column-bandwidth'), /Hz/, 'the width');
  await shot(page, `number-format-${figures}-resonators`);

  await page.getByRole('tab', { name: 'Plan' }).click();
  const rejection = page.locator('tr[data-kind="image"] td').nth(5);
  const plan = await textWhen(rejection, /\d/, 'the image rejection');
  await shot(page, `number-format-${figures}-plan`);

  await page.goto(`${editorUrl}/studies`);
  const done = page.locator('tr[data-testid="study-run"][data-kind="band"][data-status="done"]');
  await done.first().waitFor({ timeout: 180_000 });
  await done.first().getByTestId('open-study').click();
  const band = await textWhen(
    page.getByTestId('band-summary'),
    /worst tracking error [-−]?[\d.]+(?:e[-+]?\d+)? [kMmµ]?Hz/,
    'the band summary',
  );
  await shot(page, `number-format-${figures}-band`);
  return {
    flag,
    headline: headlineText,
    budget,
    loadedQ,
    bandwidth,
    echo,
    plan,
    band: /worst tracking error ([-−]?[\d.]+(?:e[-+]?\d+)? [kMmµ]?Hz)/.exec(band)![1],
  };
}

describe('number format', () => {
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
    watched.context.setDefaultTimeout(20_000);
  });
  afterEach(async () => {
    // Leave the demo account at the default for the other tests.
    await setFigures(watched.page, 4).catch(() => undefined);
    await watched.context.close();
    expect(watched.problems).toEqual([]);
  });

  it('writes every figure to the chosen significant figures, 3 and then 6', async () => {
    const { page } = watched;
    await page.setViewportSize({ width: 1440, height: 900 });
    await signIn(page, DEMO.editor, DEMO.password);
    await page.waitForURL(/\/w\/[^/]+\/chains$/);
    const wid = /\/w\/([^/]+)\//.exec(page.url())![1];
    const chainId = await chainToRead(page, wid);

    await setFigures(page, 3);
    expect(await page.locator('cw-number-format-card .example').innerText()).toContain('7.23 MHz');
    await shot(page, 'number-format-3-account');
    const three = await readAll(page, wid, chainId, 3);
    await setFigures(page, 6);
    const six = await readAll(page, wid, chainId, 6);
    process.stdout.write(`number format: 3 → ${JSON.stringify(three)}\n6 → ${JSON.stringify(six)}\n`); // prettier-ignore

    // The capacitance for 7.2 MHz with 2.2 µH (Thomson: C = 1/(ω²L)), typed as arithmetic.
    const exact = 1 / ((2 * Math.PI * 7.2e6) ** 2 * 2.2e-6);
    expect(Math.abs(valueOf(three.echo) / exact - 1)).toBeLessThan(5e-3);
    expect(Math.abs(valueOf(six.echo) / exact - 1)).toBeLessThan(5e-6);

    for (const key of Object.keys(three) as (keyof Reading)[]) {
      expect([key, digitsOf(three[key]) <= 3]).toEqual([key, true]);
      expect([key, digitsOf(six[key]) <= 6]).toEqual([key, true]);
      // The same quantity, read at 6 figures and rounded to 3, is what 3 figures showed.
      const a = valueOf(three[key]);
      const b = valueOf(six[key]);
      expect([key, Math.abs(b - a) <= Math.abs(a) * 5e-3 + 1e-12]).toEqual([key, true]);
    }
    // Computed figures rarely end in zeros: most show more digits at 6 than at 3.
    const longer = (Object.keys(three) as (keyof Reading)[]).filter(
      (key) => digitsOf(six[key]) > 3,
    );
    expect(longer.length).toBeGreaterThanOrEqual(6);
  });
});
