/**
 * The long-wave loading example built by hand at three widths (desktop, tablet, phone): a
 * new chain, its source set to the ferrite loop's Norton form, a parallel tank and a diode
 * detector inserted from the stage types (a sheet on narrower screens), the values typed
 * with units. The resonator row it shows must read as the shipped example's
 * does, column for column, with the tank-loading flag on the tank. Every screen on the way
 * passes axe-core and does not scroll sideways. Screenshots: test-results/screenshots/build-*.
 */
import type { Browser, Page } from 'playwright-core';
import { DEMO, launchBrowser, shot, signIn, uniqueSuffix, type WatchedPage } from './harness';
import { api } from './helpers/api';
import { checkScreen } from './helpers/axe';
import { openChainNamed } from './helpers/chains';
import {
  card,
  cardOfType,
  expectTypes,
  flagCodes,
  selectCard,
  settled,
  typeParam,
} from './helpers/strip';
import { waitUntil } from './helpers/wait';
import { WIDTHS, openAtWidth, type Width } from './helpers/widths';

const LOADING_DEMO = 'Long-wave time signal, ferrite loop into a diode detector';

describe('the loading example built by hand at three widths', () => {
  let browser: Browser;

  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  for (const size of WIDTHS) {
    it(`should build the long-wave loading example at ${size.width}×${size.height} (${size.name})`, async () => {
      const watched = await openAtWidth(browser, size);
      try {
        await build(watched, size);
      } finally {
        await watched.context.close();
      }
      expect(watched.problems).toEqual([]);
    });
  }
});

async function build({ page, problems }: WatchedPage, size: Width): Promise<void> {
  const phone = size.name === 'phone';
  const check = (screen: string) => checkScreen(page, `${size.name} ${screen}`, problems);
  const snap = (screen: string) => shot(page, `build-${size.name}-${screen}`);

  await signIn(page, DEMO.editor, DEMO.password);
  await page.waitForURL(/\/w\/[^/]+\/chains$/);
  const wid = /\/w\/([^/]+)\/chains$/.exec(page.url())![1];

  // The shipped example's resonator row, to hold the hand-built one against.
  await openChainNamed(page, LOADING_DEMO);
  const expected = await resonatorFigures(page);
  expect(expected.length).toBeGreaterThanOrEqual(8);

  // A new chain: a source straight into a load.
  await page.goto(`/w/${wid}/chains`);
  await page.getByRole('button', { name: 'New chain' }).click();
  const dialog = page.locator('mat-dialog-container');
  const name = `Loading example by hand ${size.name} ${uniqueSuffix()}`;
  await dialog.getByLabel('Name').fill(name);
  await check('new chain dialog');
  await dialog.getByRole('button', { name: 'Create' }).click();
  await page.waitForURL(/\/chains\/[^/]+$/);
  const chainId = page.url().split('/').pop()!;
  await expectTypes(page, ['resistive-generator', 'rc-load']);

  // The chain's frequency and sweep, as the example has them.
  await openPanel(page, phone, 'Chain');
  await typeParam(page, 'f0Hz', '77.5 kHz', '77.5 kHz', 'cw-chain-settings');
  await typeParam(page, 'sweep.startHz', '60 kHz', '60 kHz', 'cw-chain-settings');
  await typeParam(page, 'sweep.stopHz', '95 kHz', '95 kHz', 'cw-chain-settings');
  await typeParam(page, 'sweep.points', '3501', null, 'cw-chain-settings');
  await check('chain settings');
  await snap('01-chain-settings');
  await closePanel(page, phone);

  // The loop as a Norton source: 10 MΩ behind a 280 mV open-circuit EMF.
  await values(page, phone, 0);
  await typeParam(page, 'r', '10 Mohm', '10 MΩ');
  await page.locator('cw-param-panel select[data-param="level"]').selectOption('emf');
  await typeParam(page, 'emf', '280 mV', '280 mV');
  await closePanel(page, phone);

  // The tank after the source, then the detector after the tank.
  await insertAfterSelected(page, size, 'Parallel LC tank', problems);
  await expectTypes(page, ['resistive-generator', 'shunt-lc-tank', 'rc-load']);
  await values(page, phone, 1);
  await typeParam(page, 'l', '2.2 mH', '2.2 mH');
  await typeParam(page, 'ql', '120', '120');
  await typeParam(page, 'c', '1.907 nF', '1.907 nF');
  await typeParam(page, 'qc', '1000', '1000');
  await check('tank values');
  await snap('02-tank-values');
  await closePanel(page, phone);
  await insertAfterSelected(page, size, 'Diode envelope detector', problems);
  // A chain ends in one load: the detector takes the plain load's place.
  await expectTypes(page, ['resistive-generator', 'shunt-lc-tank', 'envelope-detector']);
  await values(page, phone, 2);
  await typeParam(page, 'rLoad', '10k', '10 kΩ');
  await typeParam(page, 'c', '10 pF', '10 pF');
  await closePanel(page, phone);
  await settled(page);

  // The detector loads the tank: the flag sits on the tank's card, and the resonator row
  // (frequency, loaded and unloaded Q, bandwidths, loading ratio, downstream share) reads
  // as the example's.
  await waitUntil(
    async () => (await flagCodes(cardOfType(page, 'shunt-lc-tank'))).includes('tank-overloaded'),
    'the loading flag on the tank card',
  );
  expect(await resonatorFigures(page)).toEqual(expected);
  await check('built chain, resonators');
  await snap('03-built-resonators');

  await page.getByRole('button', { name: 'Save', exact: true }).click();
  await waitUntil(
    async () => ((await page.locator('.chip').textContent()) ?? '').includes('Saved'),
    'the save',
  );
  await page.goto(`/w/${wid}/chains`);
  await api(page, 'delete', `/api/chains/${chainId}`);
}

/** The first resonator row's figures (every column after the stage and resonator names). */
async function resonatorFigures(page: Page): Promise<string[]> {
  await page.getByRole('tab', { name: 'Resonators & selectivity' }).click();
  const row = page.locator('cw-resonance-tables section').first().locator('tr.mat-mdc-row').first();
  await row.waitFor();
  await settled(page);
  const cells = await row.locator('td').allInnerTexts();
  return cells.slice(2).map((c) => c.trim());
}

/** Opens a side panel by name: beside the strip, or as a sheet on a phone. */
async function openPanel(page: Page, phone: boolean, name: string): Promise<void> {
  if (phone) {
    await page.getByTestId(`open-panel-${name.toLowerCase()}`).click();
    await page.getByTestId('panel-sheet').waitFor();
    return;
  }
  await page
    .getByRole('radio', { name, exact: true })
    .or(page.getByRole('button', { name, exact: true }))
    .first()
    .click();
}

async function closePanel(page: Page, phone: boolean): Promise<void> {
  if (!phone) return;
  await page.getByRole('button', { name: 'Close the panel' }).click();
  await page.getByTestId('panel-sheet').waitFor({ state: 'detached' });
}

/** Selects the card at `index` and shows its values (a sheet on a phone). */
async function values(page: Page, phone: boolean, index: number): Promise<void> {
  await selectCard(card(page, index));
  if (phone) await page.getByTestId('panel-sheet').waitFor();
  else await openPanel(page, phone, 'Stage');
  await page.locator('cw-param-panel').waitFor();
}

/** Inserts a stage type after the selected card from the palette (a sheet below desktop). */
async function insertAfterSelected(
  page: Page,
  size: Width,
  label: string,
  problems: string[],
): Promise<void> {
  const sheet = size.name !== 'desktop';
  if (sheet) {
    await page.getByTestId('open-palette').click();
    await page.getByTestId('palette-sheet').waitFor();
  }
  await page.getByPlaceholder('Search types').fill(label);
  const insert = page.getByRole('button', {
    name: `Insert ${label} after the selected stage`,
  });
  if (sheet) await checkScreen(page, `${size.name} palette sheet`, problems);
  await insert.click();
  if (sheet) await page.getByTestId('palette-sheet').waitFor({ state: 'detached' });
  else await page.getByPlaceholder('Search types').fill('');
}
