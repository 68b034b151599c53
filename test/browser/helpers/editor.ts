/**
 * The chain editor's gestures as the browser tests perform them: real pointer drags from the
 * palette and between cards, saving with a message, the Export menu's downloads, and the
 * edit-to-render timings the editor records.
 */
import { readFileSync } from 'node:fs';
import type { Locator, Page } from 'playwright-core';
import { shot } from '../harness';
import { card, settled } from './strip';
import { expectText } from './wait';

/** Waits for the analysis in flight to land, then takes the screenshot. */
export async function snap(page: Page, name: string): Promise<void> {
  await settled(page);
  await shot(page, name);
}

/** Picks an item of the editor's Export menu and reads the file the browser downloads. */
export async function downloadExport(
  page: Page,
  item: string,
): Promise<{ name: string; text: string }> {
  await page.getByTestId('export-menu').click();
  const [download] = await Promise.all([
    page.waitForEvent('download'),
    page.getByRole('menuitem', { name: item }).click(),
  ]);
  return { name: download.suggestedFilename(), text: readFileSync(await download.path(), 'utf8') };
}

/** Durations (ms) of the editor's edit-to-rendered-result measures on this page so far. */
export async function editToRender(page: Page): Promise<number[]> {
  return page.evaluate(() =>
    performance.getEntriesByName('cw-edit-to-render', 'measure').map((m) => Math.round(m.duration)),
  );
}

/** The budget region's text, to see it change after an edit. */
export async function budgetText(page: Page): Promise<string> {
  return (await page.getByRole('region', { name: 'Budget by node' }).textContent()) ?? '';
}

/**
 * A real pointer drag: CDK starts a drag only after the pointer moves a few pixels with the
 * button down, and sorts on intermediate moves, so the path goes in steps.
 */
export async function dragFromPalette(page: Page, label: string, target: Locator): Promise<void> {
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
export async function dragCard(page: Page, from: number, to: number): Promise<void> {
  const start = (await card(page, from).locator('.values').boundingBox())!;
  const target = (await card(page, to).boundingBox())!;
  await page.mouse.move(start.x + 20, start.y + start.height / 2);
  await page.mouse.down();
  await page.mouse.move(start.x + 10, start.y + start.height / 2, { steps: 4 });
  await page.mouse.move(target.x + target.width * 0.3, target.y + 40, { steps: 25 });
  await page.mouse.move(target.x + target.width * 0.25, target.y + 40, { steps: 5 });
  await page.mouse.up();
}

/** Saves with a message and waits for the "Saved" chip. */
export async function save(page: Page, message: string): Promise<void> {
  await page.getByLabel('Save message').fill(message);
  await page.getByRole('button', { name: 'Save', exact: true }).click();
  await expectText(page.locator('.chip'), 'Saved');
}

/** The saved version the chip shows ("Saved · v3" → 3). */
export async function savedVersion(page: Page): Promise<number> {
  const text = (await page.locator('.chip').textContent()) ?? '';
  return Number(/v(\d+)/.exec(text)?.[1]);
}

/** The side panel's switch (a toggle button, or a radio in a toggle group) named `name`. */
export async function openSidePanel(page: Page, name: string): Promise<void> {
  await page
    .getByRole('radio', { name, exact: true })
    .or(page.getByRole('button', { name, exact: true }))
    .first()
    .click();
}
