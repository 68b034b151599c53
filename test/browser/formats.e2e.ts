/**
 * The exchange formats in the browser at three widths (desktop, tablet, phone): a parts list
 * uploaded with a column-mapping preview; a chain file imported from the chain list (a
 * broken one refused with its line); a Touchstone 2.0 file with noise data attached to a
 * measured amplifier, whose noise figure then holds at the 50 Ω source it really sees; a
 * capacitor from the bin taken into a tank with its Q and tolerance; the chain saved and its
 * report printed to PDF. Every screen on the way passes axe-core (no serious or critical
 * violation) and does not scroll sideways. Screenshots: test-results/screenshots/formats-*.
 */
import type { Browser, Locator, Page } from 'playwright-core';
import { DEMO, launchBrowser, shot, signIn, uniqueSuffix, type WatchedPage } from './harness';
import { api, savedAnalysis } from './helpers/api';
import { checkScreen } from './helpers/axe';
import { AMPLIFIER_TS, EXPECTED_NF_DB, PARTS_CSV, chainFile } from './helpers/formats-data';
import { flat, pdfText, printPdf, reportReady } from './helpers/pdf';
import { cardOfType, selectCard, settled } from './helpers/strip';
import { expectValue, textAppears, waitUntil } from './helpers/wait';
import { WIDTHS, openAtWidth, type Width } from './helpers/widths';

describe('exchange formats in the browser at three widths', () => {
  let browser: Browser;

  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  for (const size of WIDTHS) {
    it(`should take a parts list, a chain file and a Touchstone 2.0 amplifier, and print, at ${size.width}×${size.height} (${size.name})`, async () => {
      const watched = await openAtWidth(browser, size);
      try {
        await walk(watched, size);
      } finally {
        await watched.context.close();
      }
      expect(watched.problems).toEqual([]);
    });
  }
});

async function walk({ page, problems }: WatchedPage, size: Width): Promise<void> {
  const phone = size.name === 'phone';
  const check = (screen: string, on: Page = page) =>
    checkScreen(on, `${size.name} ${screen}`, problems);
  const snap = (screen: string, on: Page = page, fullPage = true) =>
    shot(on, `formats-${size.name}-${screen}`, { fullPage });

  await signIn(page, DEMO.editor, DEMO.password);
  await page.waitForURL(/\/w\/[^/]+\/chains$/);
  const wid = /\/w\/([^/]+)\/chains$/.exec(page.url())![1];

  // 1. The parts bin: upload, map the three columns the guess does not know, replace.
  await page.goto(`/w/${wid}/parts`);
  await page.getByRole('heading', { name: 'Parts bin' }).waitFor();
  await check('parts bin');
  await page.locator('[data-testid="parts-csv-input"]').setInputFiles({
    name: 'team-parts.csv',
    mimeType: 'text/csv',
    buffer: Buffer.from(PARTS_CSV),
  });
  const preview = page.getByRole('region', { name: 'Upload preview' });
  // Without a kind column "150p" cannot be read; the preview says where.
  await textAppears(preview, 'line 3: say whether "150p"');
  await check('upload preview, unmapped');
  await snap('01-parts-preview-unmapped');
  await preview.locator('select[data-field="kind"]').selectOption({ label: 'L/C' });
  await preview.locator('select[data-field="partNumber"]').selectOption({ label: 'Ref' });
  await preview.locator('select[data-field="qFreq"]').selectOption({ label: '@' });
  const previewTable = page.locator('[data-testid="parts-preview"]');
  await textAppears(previewTable, 'BIN-9');
  await textAppears(previewTable, 'Q 800 at 7 MHz');
  await check('upload preview, mapped');
  await snap('02-parts-preview-mapped');
  await preview.getByRole('button', { name: 'Replace the bin' }).click();
  await preview.waitFor({ state: 'detached' });
  const bin = page.locator('[data-testid="parts-bin"]');
  await textAppears(bin, 'BIN-9');
  await textAppears(bin, '150 pF');
  await check('parts bin, filled');
  await snap('03-parts-bin');

  // 2. A broken chain file is refused with its line; a good one opens as a new chain.
  await page.goto(`/w/${wid}/chains`);
  const name = `Formats check ${size.name} ${uniqueSuffix()}`;
  const good = chainFile(name);
  const broken = good.replace('"stages": [', '"stages": [,');
  const brokenLine = broken.split('\n').findIndex((l) => l.includes('"stages": [,')) + 1;
  const chainInput = page.locator('[data-testid="chain-file-input"]');
  await chainInput.setInputFiles({
    name: 'broken.chain.json',
    mimeType: 'application/json',
    buffer: Buffer.from(broken),
  });
  await textAppears(
    page.locator('[data-testid="import-refusal"]'),
    `broken.chain.json, line ${brokenLine}, column`,
  );
  await check('chain list, import refused');
  await snap('04-import-refused');
  await chainInput.setInputFiles({
    name: 'formats-check.chain.json',
    mimeType: 'application/json',
    buffer: Buffer.from(good),
  });
  await page.waitForURL(/\/chains\/[^/]+$/);
  const chainId = page.url().split('/').pop()!;
  await page.getByRole('heading', { level: 1, name }).waitFor();

  // 3. The measured amplifier: attach the 2.0 file, take its noise parameters. The values
  // sit beside the strip on wider screens and in a sheet on a phone.
  await openValues(page, phone, 'measured-two-port');
  const panel = page.locator('cw-param-panel');
  await panel.locator('[data-testid="data-file-input"]').setInputFiles({
    name: 'test-amplifier.ts',
    mimeType: 'text/plain',
    buffer: Buffer.from(AMPLIFIER_TS),
  });
  // The file is in once the select shows it chosen: a file of that name uploaded at another
  // width may be listed already, before this upload has landed.
  await expectChosen(panel.locator('select[data-param="dataFileId"]'), 'test-amplifier.ts');
  const noise = panel.locator('select[data-param="noise"]');
  await noise.selectOption({ label: 'Parameters from the data file (active device)' });
  await settled(page);
  await check('editor, amplifier values');
  await snap('05-amplifier-values');
  await closeValues(page, phone);

  const budget = page.getByRole('region', { name: 'Budget by node' });
  await budget.waitFor();
  const stageNf = budget.getByRole('row', { name: /Stage noise figure/ });
  // At the 50 Ω source: 1.71 dB as the app rounds it, not the file's 1.0 dB minimum.
  const nfCell = await cellNear(stageNf, EXPECTED_NF_DB, 'dB');
  await nfCell.scrollIntoViewIfNeeded();
  await expectInView(nfCell);
  await check('editor, budget with the amplifier');
  await snap('06-amplifier-noise-at-its-source');

  // 4. A capacitor from the bin: value, Q and tolerance come with it.
  await openValues(page, phone, 'shunt-lc-tank');
  await panel.locator('button[data-pick="c"]').click();
  const pick = page.getByRole('menuitem', { name: /BIN-9/ });
  await pick.waitFor();
  await check('editor, parts bin menu');
  await snap('07-bin-menu', page, false);
  await pick.click();
  await textAppears(
    panel.locator('[data-part-of="c"]'),
    'From the bin: BIN-9, Q 800 at 7 MHz, ± 2 %',
  );
  await expectValue(panel.locator('input[data-param="c"]'), '150 pF');
  await expectValue(panel.locator('input[data-param="qc"]'), '800');
  await expectValue(panel.locator('input[data-param="c:tolerance"]'), '2');
  await panel.locator('[data-part-of="c"]').scrollIntoViewIfNeeded();
  await check('editor, capacitor from the bin');
  await snap('08-capacitor-from-bin');
  await closeValues(page, phone);

  // 5. Save, then print the report from the editor's Report link (a new tab).
  await page.getByRole('button', { name: 'Save', exact: true }).click();
  await textAppears(page.locator('.chip'), 'Saved');
  const { analysis } = await savedAnalysis(page, chainId);
  if (phone) await page.getByRole('button', { name: /^More:/ }).click();
  const [report] = await Promise.all([
    page.context().waitForEvent('page'),
    page.getByTestId('open-report').click(),
  ]);
  await report.waitForURL(/\/chains\/[^/]+\/report$/);
  await reportReady(report);
  await report.getByRole('heading', { level: 1, name }).waitFor();
  await check('report', report);
  await snap('09-report', report);
  const text = pdfText(await printPdf(report, `formats-${size.name}-report`));
  expect(text).toContain(name);
  for (const flag of analysis.flags) expect(text).toContain(flat(flag.message));
  // The budget as printed: the amplifier's noise figure at its source, in the report's row.
  const printedNf = new RegExp(`Stage noise figure[^]*?${nfRounded(await nfCell.innerText())}`);
  expect(text).toMatch(printedNf);
  expect(text).toContain('Cautions');
  await report.close();

  // Leave the chain list as it was, so later tests find the demo chains on its first page.
  await page.goto(`/w/${wid}/chains`);
  await api(page, 'delete', `/api/chains/${chainId}`);
}

/** Waits until a select's chosen option reads `label` (a part of it). */
async function expectChosen(select: Locator, label: string): Promise<void> {
  let seen = '';
  try {
    await waitUntil(async () => {
      seen = await select.evaluate(
        (el) => (el as HTMLSelectElement).selectedOptions[0]?.textContent?.trim() ?? '',
      );
      return seen.includes(label);
    }, `"${label}" chosen`);
  } catch {
    throw new Error(`expected "${label}" chosen, the select shows "${seen}"`);
  }
}

/** Opens a stage's values: select its card; on a phone the values come up as a sheet. */
async function openValues(page: Page, phone: boolean, type: string): Promise<void> {
  await selectCard(cardOfType(page, type));
  if (phone) await page.getByTestId('panel-sheet').waitFor();
  await page.locator('cw-param-panel').waitFor();
}

async function closeValues(page: Page, phone: boolean): Promise<void> {
  if (!phone) return;
  await page.getByRole('button', { name: 'Close the panel' }).click();
  await page.getByTestId('panel-sheet').waitFor({ state: 'detached' });
}

/**
 * The row's cell showing `expected` (in `unit`) as the app rounds it: within half a unit of
 * its last shown digit. Waits for it, since the figure follows the analysis.
 */
async function cellNear(row: Locator, expected: number, unit: string): Promise<Locator> {
  const cells = row.locator('td.value');
  let seen: string[] = [];
  let found = -1;
  try {
    await waitUntil(
      async () => {
        seen = await cells.allInnerTexts();
        found = seen.findIndex((t) => shows(t, expected, unit));
        return found >= 0;
      },
      `${expected.toFixed(3)} ${unit}`,
    );
  } catch {
    throw new Error(
      `no cell shows ${expected.toFixed(3)} ${unit}; the row read ${seen.join(' | ')}`,
    );
  }
  return cells.nth(found);
}

function shows(text: string, expected: number, unit: string): boolean {
  const match = new RegExp(`(-?\\d+(?:\\.(\\d+))?)\\s*${unit}`).exec(text);
  if (!match) return false;
  const step = 10 ** -(match[2]?.length ?? 0);
  return Math.abs(Number(match[1]) - expected) <= step / 2 + 1e-9;
}

/** The number as shown in a cell, escaped for a pattern. */
function nfRounded(cell: string): string {
  const number = /-?\d+(?:\.\d+)?/.exec(cell)?.[0] ?? cell;
  return number.replace('.', '\\.');
}

/** The element's left edge (and a little of it) lies within the window. */
async function expectInView(locator: Locator): Promise<void> {
  const box = await locator.boundingBox();
  expect(box).not.toBeNull();
  const width = locator.page().viewportSize()!.width;
  expect(box!.x).toBeGreaterThanOrEqual(-1);
  expect(box!.x + Math.min(box!.width, 40)).toBeLessThanOrEqual(width + 1);
}
