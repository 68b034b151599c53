/**
 * The exchange formats in the browser: a chain file imported from the chain list (a broken
 * one refused with its line), a Touchstone 2.0 file with noise data attached to a measured
 * amplifier whose noise figure then holds at the 50 Ω source it really sees, and a parts
 * list uploaded with a column-mapping preview, one of whose capacitors is taken into a
 * tank with its Q and tolerance. Screenshots go to test-results/screenshots/formats-*.png.
 */
import type { Browser, Locator, Page } from 'playwright-core';
import {
  DEMO,
  launchBrowser,
  openPage,
  shot,
  signIn,
  uniqueSuffix,
  type WatchedPage,
} from './harness';

/**
 * An amplifier measured at 100 and 200 MHz: 20 dB gain, matched, with the same noise
 * parameters at both points: NFmin 1 dB, Γopt 0.5∠0°, Rn 25 Ω (2.0: ohms).
 */
const AMPLIFIER_TS = [
  '! Test amplifier for the browser check',
  '[Version] 2.0',
  '# MHz S RI R 50',
  '[Number of Ports] 2',
  '[Two-Port Data Order] 12_21',
  '[Number of Frequencies] 2',
  '[Number of Noise Frequencies] 2',
  '[Reference] 50 50',
  '[Network Data]',
  '100 0 0 0.01 0 10 0 0 0',
  '200 0 0 0.01 0 10 0 0 0',
  '[Noise Data]',
  '100 1.0 0.5 0 25',
  '200 1.0 0.5 0 25',
  '[End]',
  '',
].join('\n');

/**
 * The expected noise figure from a 50 Ω source (Γs = 0), by the two-port noise formula in
 * reflection form (Pozar, "Microwave Engineering", noise figure of a two-port):
 * F = Fmin + 4·rn·|Γs − Γopt|² / ((1 − |Γs|²)·|1 + Γopt|²), rn = 25/50.
 */
const EXPECTED_NF_DB = 10 * Math.log10(10 ** 0.1 + (4 * 0.5 * 0.25) / 1.5 ** 2); // 1.706 dB

const PARTS_CSV = [
  'Ref;L/C;Nominal;Qu;@;Tol;Remarks',
  'BIN-7;L;2.2 uH;85;7 MHz;5;air core',
  'BIN-9;C;150p;800;7 MHz;2;NP0 disc',
  '',
].join('\n');

function chainFile(name: string): string {
  return JSON.stringify(
    {
      format: 'chainwright-chain',
      formatVersion: 1,
      name,
      description: 'A measured amplifier ahead of a tank, for the formats check.',
      settings: {
        f0Hz: 150e6,
        sweep: { startHz: 100e6, stopHz: 200e6, points: 41, scale: 'lin' },
      },
      stages: [
        { id: 'src', type: 'resistive-generator', label: 'Signal generator', values: { r: 50 } },
        {
          id: 'amp',
          type: 'measured-two-port',
          label: 'Measured amplifier',
          values: { noise: 'passive' },
        },
        { id: 'tank', type: 'shunt-lc-tank', label: 'Output tank', values: {} },
        { id: 'load', type: 'rc-load', label: 'Load', values: {} },
      ],
    },
    null,
    2,
  );
}

describe('exchange formats in the browser', () => {
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

  it('imports a chain file, uses a Touchstone 2.0 amplifier with noise data and a part from the bin', async () => {
    const { page } = watched;
    await page.setViewportSize({ width: 1440, height: 900 });
    await signIn(page, DEMO.editor, DEMO.password);
    await page.waitForURL(/\/w\/[^/]+\/chains$/);
    const wid = /\/w\/([^/]+)\/chains$/.exec(page.url())![1];

    // 1. The parts bin: upload, map the two columns the guess does not know, add.
    await page.goto(`/w/${wid}/parts`);
    await page.getByRole('heading', { name: 'Parts bin' }).waitFor();
    await page.locator('[data-testid="parts-csv-input"]').setInputFiles({
      name: 'team-parts.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from(PARTS_CSV),
    });
    const preview = page.getByRole('region', { name: 'Upload preview' });
    // Without a kind column "150p" cannot be read; the preview says where.
    await textAppears(preview, 'line 3: say whether "150p"');
    await shot(page, 'formats-01-parts-preview-unmapped');
    await preview.locator('select[data-field="kind"]').selectOption({ label: 'L/C' });
    await preview.locator('select[data-field="partNumber"]').selectOption({ label: 'Ref' });
    await preview.locator('select[data-field="qFreq"]').selectOption({ label: '@' });
    const previewTable = page.locator('[data-testid="parts-preview"]');
    await textAppears(previewTable, 'BIN-9');
    await textAppears(previewTable, 'Q 800 at 7 MHz');
    await shot(page, 'formats-02-parts-preview-mapped');
    await preview.getByRole('button', { name: 'Replace the bin' }).click();
    const bin = page.locator('[data-testid="parts-bin"]');
    await textAppears(bin, 'BIN-9');
    await textAppears(bin, '150 pF');
    await shot(page, 'formats-03-parts-bin');
    // The bin on a phone: the table scrolls sideways inside its frame, the page does not.
    await page.setViewportSize({ width: 390, height: 844 });
    await shot(page, 'formats-03b-parts-bin-phone');
    await page.setViewportSize({ width: 1440, height: 900 });

    // 2. A broken chain file is refused with its line; a good one opens as a new chain.
    await page.goto(`/w/${wid}/chains`);
    const name = `Formats check ${uniqueSuffix()}`;
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
    await shot(page, 'formats-04-import-refused');
    await chainInput.setInputFiles({
      name: 'formats-check.chain.json',
      mimeType: 'application/json',
      buffer: Buffer.from(good),
    });
    await page.waitForURL(/\/chains\/[^/]+$/);
    await textAppears(page.locator('body'), name);

    // 3. The measured amplifier: attach the 2.0 file, take its noise parameters.
    await selectStage(page, 'measured-two-port');
    const panel = page.locator('cw-param-panel');
    await panel.locator('[data-testid="data-file-input"]').setInputFiles({
      name: 'test-amplifier.ts',
      mimeType: 'text/plain',
      buffer: Buffer.from(AMPLIFIER_TS),
    });
    await textAppears(panel.locator('select[data-param="dataFileId"]'), 'test-amplifier.ts');
    await panel
      .locator('select[data-param="noise"]')
      .selectOption({ label: 'Noise parameters from the data file (active device)' });
    const budget = page.getByRole('region', { name: 'Budget by node' });
    await budget.waitFor();
    const stageNf = budget.getByRole('row', { name: /Stage noise figure/ });
    // Displayed to the default 4 significant figures: 1.706 dB at the 50 Ω source, not the
    // 1.0 dB minimum.
    await textAppears(stageNf, `${Number(EXPECTED_NF_DB.toPrecision(4))} dB`);
    await stageNf.scrollIntoViewIfNeeded();
    await shot(page, 'formats-05-amplifier-noise-at-its-source');

    // 4. A capacitor from the bin: value, Q and tolerance come with it.
    await selectStage(page, 'shunt-lc-tank');
    await panel.locator('button[data-pick="c"]').click();
    await page.getByRole('menuitem', { name: /BIN-9/ }).click();
    await textAppears(
      panel.locator('[data-part-of="c"]'),
      'From the bin: BIN-9, Q 800 at 7 MHz, ± 2 %',
    );
    await expectValue(panel.locator('input[data-param="c"]'), '150 pF');
    await expectValue(panel.locator('input[data-param="qc"]'), '800');
    await expectValue(panel.locator('input[data-param="c:tolerance"]'), '2');
    await panel.locator('[data-part-of="c"]').scrollIntoViewIfNeeded();
    await shot(page, 'formats-06-capacitor-from-bin');
  });
});

async function selectStage(page: Page, type: string): Promise<void> {
  await page
    .locator('cw-stage-strip .slot')
    .filter({ has: page.locator(`article[data-stage-type="${type}"]`) })
    .first()
    .getByRole('button', { name: /^Select / })
    .click();
}

/** Waits (up to 20 s) until the input's value is `text`. */
async function expectValue(input: Locator, text: string): Promise<void> {
  const deadline = Date.now() + 20_000;
  for (;;) {
    const value = await input.inputValue();
    if (value === text) return;
    if (Date.now() > deadline) throw new Error(`expected the value "${text}", got "${value}"`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

/** Waits (up to 20 s) until the locator's text contains `text`. */
async function textAppears(where: Locator, text: string): Promise<void> {
  const deadline = Date.now() + 20_000;
  for (;;) {
    const found = (await where.allInnerTexts()).join('\n');
    if (found.includes(text)) return;
    if (Date.now() > deadline) {
      throw new Error(`"${text}" did not appear; the text was: ${found.slice(0, 600)}`);
    }
    await new Promise((r) => setTimeout(r, 200));
  }
}
