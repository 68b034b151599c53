/**
 * The chain editor end to end, against a running server with demo data: build a chain
 * from the palette with real pointer drags, type values with units, watch the budget,
 * a plot and the tank-loading flag follow, save, restore an older revision, and resolve
 * a save conflict with a second browser session.
 */
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
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

describe('chain editor', () => {
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

  it('should build, analyse, save, restore and resolve a conflict', async () => {
    const { page } = watched;
    const name = `Broadcast tank ${uniqueSuffix()}`;
    await signIn(page, DEMO.editor, DEMO.password);
    await page.waitForURL(/\/w\/[^/]+\/chains$/);

    // A new chain starts as a source straight into a load.
    await page.getByRole('button', { name: 'New chain' }).click();
    const dialog = page.locator('mat-dialog-container');
    await dialog.getByLabel('Name').fill(name);
    // Create opens the new chain in the editor.
    await dialog.getByRole('button', { name: 'Create' }).click();
    await page.waitForURL(/\/chains\/[^/]+$/);
    await expect(cards(page)).toHaveCountEventually(2);
    await snap(page, 'editor-01-new-chain');

    // Drag a shunt tank from the palette onto the load card: it lands between the two.
    await dragFromPalette(page, 'Parallel LC tank', card(page, 1));
    await expect(cards(page)).toHaveCountEventually(3);
    await expectTypes(page, ['resistive-generator', 'shunt-lc-tank', 'rc-load']);
    await snap(page, 'editor-02-tank-dropped');

    // Values with units: a 1 kΩ generator, a 22 µH coil and the capacitor for 1 MHz.
    await card(page, 0)
      .getByRole('button', { name: /^Select / })
      .click();
    await typeParam(page, 'r', '1k', '= 1 kΩ');
    await card(page, 1)
      .getByRole('button', { name: /^Select / })
      .click();
    await typeParam(page, 'l', '22 uH', '= 22 µH');
    await typeParam(page, 'c', '1/((2*pi*1 MHz)^2*22 uH)', '= 1.151 nF');
    // A wrong dimension is refused in plain words, and the typed text stays.
    await typeParam(page, 'ql', '3 pF', null);
    await expectText(fieldOf(page, 'ql'), 'expected a plain ratio, got a capacitance');
    expect(await param(page, 'ql').inputValue()).toBe('3 pF');
    await typeParam(page, 'ql', '120', '= 120');
    await expect(page.getByRole('region', { name: 'Budget by node' })).toBeVisibleEventually();
    await snap(page, 'editor-03-values-typed');

    // The budget table and a plot follow the edits.
    const budgetBefore = await budgetText(page);
    await typeParam(page, 'l', '33 uH', '= 33 µH');
    await waitUntil(async () => (await budgetText(page)) !== budgetBefore, 'the budget to change');
    await page.getByRole('tab', { name: 'Plots' }).click();
    await page
      .locator('cw-result-plots .js-plotly-plot, cw-result-plots svg')
      .first()
      .waitFor({ timeout: 30000 });
    await snap(page, 'editor-04-plot');
    const firstTrace = page.locator('cw-result-plots path.js-line').first();
    const traceBefore = await firstTrace.getAttribute('d');
    await typeParam(page, 'l', '22 uH', '= 22 µH');
    await waitUntil(
      async () => (await firstTrace.getAttribute('d')) !== traceBefore,
      'the plot to redraw',
    );
    await page.getByRole('tab', { name: 'Budget' }).click();

    // A high-impedance detector leaves the tank alone; low-impedance phones across it
    // flag it; putting the detector back clears the flag.
    const overload = card(page, 1).locator('[data-flag-code="tank-overloaded"]');
    await dragFromPalette(page, 'Diode envelope detector', card(page, 2));
    await expectTypes(page, ['resistive-generator', 'shunt-lc-tank', 'envelope-detector']);
    await waitUntil(
      async () => (await overload.count()) === 0,
      'no loading flag with the detector',
    );
    await dragFromPalette(page, 'Low-impedance headphone', card(page, 2));
    await expectTypes(page, ['resistive-generator', 'shunt-lc-tank', 'headphone-low-z']);
    await typeParam(page, 'l', '1 uH', '= 1 µH');
    await expectText(overload, 'Low-impedance headphone');
    await snap(page, 'editor-05-tank-overloaded');
    await dragFromPalette(page, 'Diode envelope detector', card(page, 2));
    await expectTypes(page, ['resistive-generator', 'shunt-lc-tank', 'envelope-detector']);
    await waitUntil(async () => (await overload.count()) === 0, 'the loading flag to clear');
    await snap(page, 'editor-06-flag-cleared');

    // Between a source and a load there is nowhere to move the tank: both buttons say so.
    expect(await card(page, 1).getByRole('button', { name: 'Move left' }).isDisabled()).toBe(true);
    expect(await card(page, 1).getByRole('button', { name: 'Move right' }).isDisabled()).toBe(true);

    // Save, change, save again; then restore the first save from the history.
    await save(page, 'Tank with detector');
    const firstVersion = await savedVersion(page);
    await card(page, 1)
      .getByRole('button', { name: /^Select / })
      .click();
    await typeParam(page, 'l', '47 uH', '= 47 µH');
    await save(page, 'Bigger coil');
    await page
      .getByRole('radio', { name: 'History', exact: true })
      .or(page.getByRole('button', { name: 'History', exact: true }))
      .first()
      .click();
    const older = page.locator(`cw-revision-panel li[data-version="${firstVersion}"]`);
    await older.getByRole('button', { name: 'View' }).click();
    await expectText(page.locator('.banner'), `Viewing revision ${firstVersion}`);
    await snap(page, 'editor-07-viewing-revision');
    await page.getByRole('button', { name: 'Restore this revision' }).click();
    await expectText(
      page.locator('simple-snack-bar, .mat-mdc-snack-bar-label').first(),
      `Revision ${firstVersion} restored`,
    );
    await card(page, 1)
      .getByRole('button', { name: /^Select / })
      .click();
    await page
      .getByRole('radio', { name: 'Stage', exact: true })
      .or(page.getByRole('button', { name: 'Stage', exact: true }))
      .first()
      .click();
    expect(await param(page, 'l').inputValue()).toBe('22 uH');
    await snap(page, 'editor-08-restored');

    // A colleague saves first in another session; our save meets the conflict dialog.
    const chainUrl = page.url();
    const other = await openPage(browser);
    try {
      await signIn(other.page, DEMO.owner, DEMO.password);
      await other.page.goto(chainUrl);
      await expect(cards(other.page)).toHaveCountEventually(3);
      await card(other.page, 1)
        .getByRole('button', { name: /^Select / })
        .click();
      await typeParam(other.page, 'l', '10 uH', '= 10 µH');
      await save(other.page, 'Colleague tweak');
      expect(other.problems).toEqual([]);
    } finally {
      await other.context.close();
    }
    await typeParam(page, 'l', '27 uH', '= 27 µH');
    await page.getByRole('button', { name: 'Save', exact: true }).click();
    const conflict = page.locator('mat-dialog-container');
    await expectText(conflict, 'Someone saved this chain first');
    await snap(page, 'editor-09-conflict');
    await conflict.getByRole('button', { name: 'Keep mine as a variant' }).click();
    await page.waitForURL((url) => url.href !== chainUrl && /\/chains\/[^/]+$/.test(url.pathname));
    await expectText(page.locator('h1'), `${name} (my edits)`);
    await card(page, 1)
      .getByRole('button', { name: /^Select / })
      .click();
    await waitUntil(
      async () => (await param(page, 'l').inputValue()) === '27 uH',
      'my edit in the variant',
    );
    await snap(page, 'editor-10-variant');

    // Keyboard alternatives: insert a triode after the selected tank with the palette's
    // button, then move it left with Alt+←. A tube stage brings its caution.
    await page.getByPlaceholder('Search types').fill('Triode');
    await page
      .getByRole('button', { name: 'Insert Triode stage after the selected stage' })
      .click();
    await page.getByPlaceholder('Search types').fill('');
    await expectTypes(page, [
      'resistive-generator',
      'shunt-lc-tank',
      'triode-amplifier',
      'envelope-detector',
    ]);
    await expectText(page.getByRole('note', { name: 'Safety cautions' }), 'plate voltages');
    await card(page, 2).focus();
    await page.keyboard.press('Alt+ArrowLeft');
    await expectTypes(page, [
      'resistive-generator',
      'triode-amplifier',
      'shunt-lc-tank',
      'envelope-detector',
    ]);
    await page.getByRole('button', { name: 'Undo' }).click();
    await expectTypes(page, [
      'resistive-generator',
      'shunt-lc-tank',
      'triode-amplifier',
      'envelope-detector',
    ]);
    // The same move by a pointer drag of the card, then undone again.
    await dragCard(page, 2, 1);
    await expectTypes(page, [
      'resistive-generator',
      'triode-amplifier',
      'shunt-lc-tank',
      'envelope-detector',
    ]);
    await page.getByRole('button', { name: 'Undo' }).click();
    await expectTypes(page, [
      'resistive-generator',
      'shunt-lc-tank',
      'triode-amplifier',
      'envelope-detector',
    ]);
    await page
      .getByRole('radio', { name: 'Chain', exact: true })
      .or(page.getByRole('button', { name: 'Chain', exact: true }))
      .first()
      .click();
    await page.locator('input[data-param="channelBandwidthHz"]').fill('9k');
    await expectText(
      page
        .locator('input[data-param="channelBandwidthHz"]')
        .locator('xpath=ancestor::cw-quantity-field[1]'),
      '= 9 kHz',
    );
    // A chain the server refuses keeps the typed input and says why in a banner.
    const nameField = page.getByLabel('Name', { exact: true });
    const chainName = await nameField.inputValue();
    await nameField.fill('');
    await expectText(page.getByTestId('analysis-refused'), 'Not analysed');
    await page.mouse.wheel(0, -5000);
    await snap(page, 'editor-11-caution-settings-refused');
    await nameField.fill(chainName);
    await waitUntil(
      async () => (await page.getByTestId('analysis-refused').count()) === 0,
      'the refusal to clear',
    );
    await save(page, 'Triode stage after the tank');

    // The timeline restarts with the page: keep the figures measured so far.
    const figures = await editToRender(page);

    // Unsaved edits survive a reload as a local draft, offered back on opening.
    await page
      .getByRole('radio', { name: 'Stage', exact: true })
      .or(page.getByRole('button', { name: 'Stage', exact: true }))
      .first()
      .click();
    await card(page, 1)
      .getByRole('button', { name: /^Select / })
      .click();
    await typeParam(page, 'l', '30 uH', '= 30 µH');
    page.once('dialog', (leaveQuestion) => void leaveQuestion.accept());
    await page.reload();
    await page.getByRole('button', { name: 'Restore draft' }).click();
    await card(page, 1)
      .getByRole('button', { name: /^Select / })
      .click();
    await waitUntil(
      async () => (await param(page, 'l').inputValue()) === '30 uH',
      'the draft value',
    );
    await expectText(page.locator('.chip'), 'Unsaved edits');
    await snap(page, 'editor-12-draft-restored');

    // An export carries the unsaved edits: the chain file holds the draft's 30 µH.
    const chainFile = await downloadExport(page, 'Chain file (JSON)');
    expect(chainFile.name).toMatch(/^[a-z0-9-]+\.chain\.json$/);
    const exported = JSON.parse(chainFile.text);
    expect(exported.name).toBe(chainName);
    expect(exported.stages[1].values.l).toBeCloseTo(30e-6, 12);

    // A viewer gets the same screen with nothing that changes the chain.
    const viewer = await openPage(browser);
    try {
      await signIn(viewer.page, DEMO.viewer, DEMO.password);
      await viewer.page.goto(page.url());
      await expect(cards(viewer.page)).toHaveCountEventually(4);
      await expectText(viewer.page.locator('.chip'), 'Read only');
      expect(await viewer.page.getByRole('button', { name: 'Save', exact: true }).count()).toBe(0);
      expect(await viewer.page.getByRole('button', { name: /^Insert / }).count()).toBe(0);
      expect(await viewer.page.getByRole('button', { name: 'Remove stage' }).count()).toBe(0);
      await card(viewer.page, 1)
        .getByRole('button', { name: /^Select / })
        .click();
      expect(await param(viewer.page, 'l').isDisabled()).toBe(true);
      await snap(viewer.page, 'editor-13-viewer');
      // Viewers may export too.
      const netlist = await downloadExport(viewer.page, 'SPICE netlist (ngspice)');
      expect(netlist.name).toMatch(/^[a-z0-9-]+\.cir$/);
      expect(netlist.text).toMatch(/^\.end$/m);
      expect(viewer.problems).toEqual([]);
    } finally {
      await viewer.context.close();
    }

    const all = [...figures, ...(await editToRender(page))].sort((a, b) => a - b);
    const median = all[Math.floor(all.length / 2)];
    // For scripts/bench.ts: the target is 150 ms from edit to rendered result, debounce included.
    mkdirSync(join(process.cwd(), 'test-results'), { recursive: true });
    writeFileSync(
      join(process.cwd(), 'test-results', 'edit-to-render.json'),
      JSON.stringify({ medianMs: median, samplesMs: all, targetMs: 150 }, null, 2),
    );
    console.log(
      `cw-edit-to-render over ${all.length} edits: median ${median} ms, max ${all.at(-1)} ms (includes the 50 ms debounce)`,
    );
  });
});

// Helpers

/** Waits for the analysis in flight to land, then takes the screenshot. */
/** Picks an item of the editor's Export menu and reads the file the browser downloads. */
async function downloadExport(page: Page, item: string): Promise<{ name: string; text: string }> {
  await page.getByTestId('export-menu').click();
  const [download] = await Promise.all([
    page.waitForEvent('download'),
    page.getByRole('menuitem', { name: item }).click(),
  ]);
  return { name: download.suggestedFilename(), text: readFileSync(await download.path(), 'utf8') };
}

async function snap(page: Page, name: string): Promise<void> {
  await waitUntil(
    async () =>
      (await page.getByRole('progressbar', { name: 'Analysing the chain' }).count()) === 0,
    'the analysis to settle',
  );
  await shot(page, name);
}

/** Durations (ms) of the editor's edit-to-rendered-result measures on this page so far. */
async function editToRender(page: Page): Promise<number[]> {
  return page.evaluate(() =>
    performance.getEntriesByName('cw-edit-to-render', 'measure').map((m) => Math.round(m.duration)),
  );
}

function cards(page: Page): Locator {
  return page.locator('cw-stage-strip .slot');
}

function card(page: Page, index: number): Locator {
  return cards(page).nth(index);
}

function param(page: Page, key: string): Locator {
  return page.locator(`cw-param-panel input[data-param="${key}"]`);
}

function fieldOf(page: Page, key: string): Locator {
  return param(page, key).locator('xpath=ancestor::cw-quantity-field[1]');
}

async function cardTypes(page: Page): Promise<string[]> {
  return cards(page)
    .locator('article')
    .evaluateAll((els) => els.map((el) => el.getAttribute('data-stage-type') ?? ''));
}

/** Waits until the strip shows these stage types in this order (rendering is asynchronous). */
async function expectTypes(page: Page, types: string[]): Promise<void> {
  let seen: string[] = [];
  try {
    await waitUntil(async () => {
      seen = await cardTypes(page);
      return JSON.stringify(seen) === JSON.stringify(types);
    }, 'the stage order');
  } catch {
    throw new Error(`expected stages ${types.join(' → ')}, saw ${seen.join(' → ')}`);
  }
}

async function budgetText(page: Page): Promise<string> {
  return (await page.getByRole('region', { name: 'Budget by node' }).textContent()) ?? '';
}

/** Types into a parameter field and waits for the value read back beside it (null: an error). */
async function typeParam(
  page: Page,
  key: string,
  text: string,
  readBack: string | null,
): Promise<void> {
  const field = param(page, key);
  await field.fill(text);
  if (readBack === null) return;
  await expectText(fieldOf(page, key).locator('output'), readBack);
}

/**
 * A real pointer drag: CDK starts a drag only after the pointer moves a few pixels with the
 * button down, and sorts on intermediate moves, so the path goes in steps.
 */
async function dragFromPalette(page: Page, label: string, target: Locator): Promise<void> {
  await page.getByPlaceholder('Search types').fill(label);
  const item = page.locator('cw-stage-palette .item').filter({ hasText: label }).first();
  await target.scrollIntoViewIfNeeded();
  const from = (await item.boundingBox())!;
  const to = (await target.boundingBox())!;
  await page.mouse.move(from.x + 30, from.y + from.height / 2);
  await page.mouse.down();
  await page.mouse.move(from.x + 40, from.y + from.height / 2 + 8, { steps: 4 });
  await page.mouse.move(to.x + to.width * 0.3, to.y + to.height / 2, { steps: 25 });
  await page.mouse.move(to.x + to.width * 0.25, to.y + to.height / 2, { steps: 5 });
  await page.mouse.up();
  await page.getByPlaceholder('Search types').fill('');
}

/** Drags the card at `from` over the card at `to` (its left part) and drops it there. */
async function dragCard(page: Page, from: number, to: number): Promise<void> {
  const start = (await card(page, from).locator('.values').boundingBox())!;
  const target = (await card(page, to).boundingBox())!;
  await page.mouse.move(start.x + 20, start.y + start.height / 2);
  await page.mouse.down();
  await page.mouse.move(start.x + 10, start.y + start.height / 2, { steps: 4 });
  await page.mouse.move(target.x + target.width * 0.3, target.y + 40, { steps: 25 });
  await page.mouse.move(target.x + target.width * 0.25, target.y + 40, { steps: 5 });
  await page.mouse.up();
}

async function save(page: Page, message: string): Promise<void> {
  await page.getByLabel('Save message').fill(message);
  await page.getByRole('button', { name: 'Save', exact: true }).click();
  await expectText(page.locator('.chip'), 'Saved');
}

async function savedVersion(page: Page): Promise<number> {
  const text = (await page.locator('.chip').textContent()) ?? '';
  return Number(/v(\d+)/.exec(text)?.[1]);
}

async function expectText(locator: Locator, text: string): Promise<void> {
  await waitUntil(
    async () => ((await locator.first().textContent()) ?? '').includes(text),
    `"${text}"`,
  );
}

async function waitUntil(
  check: () => Promise<boolean>,
  what: string,
  timeoutMs = 15000,
): Promise<void> {
  const end = Date.now() + timeoutMs;
  while (Date.now() < end) {
    if (await check()) return;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`timed out waiting for ${what}`);
}

// Two small polling matchers, so the test reads as a list of expectations.
expect.extend({
  async toHaveCountEventually(locator: Locator, count: number) {
    try {
      await waitUntil(async () => (await locator.count()) === count, `${count} items`);
      return { pass: true, message: () => `expected not ${count}` };
    } catch {
      return { pass: false, message: () => `expected ${count} items, found ${0}` };
    }
  },
  async toBeVisibleEventually(locator: Locator) {
    try {
      await locator.first().waitFor({ state: 'visible', timeout: 15000 });
      return { pass: true, message: () => 'expected hidden' };
    } catch {
      return { pass: false, message: () => 'expected the element to become visible' };
    }
  },
});

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace jest {
    interface Matchers<R> {
      toHaveCountEventually(count: number): Promise<R>;
      toBeVisibleEventually(): Promise<R>;
    }
  }
}
