/**
 * The editor's stage strip and parameter panel as the browser tests reach them: cards by
 * position, label or stage type, the panel's fields, and the wait for an analysis to land.
 */
import type { Locator, Page } from 'playwright-core';
import { expectText, waitUntil } from './wait';

/** Every card slot of the strip, in chain order. */
export function cards(page: Page): Locator {
  return page.locator('cw-stage-strip .slot');
}

export function card(page: Page, index: number): Locator {
  return cards(page).nth(index);
}

/** The first card whose text holds `label`. */
export function cardNamed(page: Page, label: string): Locator {
  return cards(page).filter({ hasText: label }).first();
}

/** The first card of a stage type (its `data-stage-type`). */
export function cardOfType(page: Page, type: string): Locator {
  return cards(page)
    .filter({ has: page.locator(`article[data-stage-type="${type}"]`) })
    .first();
}

/** Clicks a card's select button (on a phone this opens the values sheet). */
export async function selectCard(slot: Locator): Promise<void> {
  await slot.getByRole('button', { name: /^Select / }).click();
}

/** The stage types on the strip, in order. */
export async function cardTypes(page: Page): Promise<string[]> {
  return cards(page)
    .locator('article')
    .evaluateAll((els) => els.map((el) => el.getAttribute('data-stage-type') ?? ''));
}

/** Waits until the strip shows these stage types in this order (rendering is asynchronous). */
export async function expectTypes(page: Page, types: string[]): Promise<void> {
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

/** The flag codes shown on a card. */
export async function flagCodes(slot: Locator): Promise<string[]> {
  return slot
    .locator('[data-flag-code]')
    .evaluateAll((els) => els.map((el) => el.getAttribute('data-flag-code') ?? ''));
}

/** Waits until no analysis is in flight. */
export async function settled(page: Page): Promise<void> {
  await waitUntil(
    async () =>
      (await page.getByRole('progressbar', { name: 'Analysing the chain' }).count()) === 0,
    'the analysis to settle',
  );
}

/** A parameter input of the values panel (or of another form, such as `cw-chain-settings`). */
export function param(page: Page, key: string, form = 'cw-param-panel'): Locator {
  return page.locator(`${form} input[data-param="${key}"]`);
}

/** The quantity field around a parameter input (its echo and its error). */
export function fieldOf(page: Page, key: string, form = 'cw-param-panel'): Locator {
  return param(page, key, form).locator('xpath=ancestor::cw-quantity-field[1]');
}

/** Types into a parameter field and waits for the value read back beside it (null: an error). */
export async function typeParam(
  page: Page,
  key: string,
  text: string,
  readBack: string | null,
  form = 'cw-param-panel',
): Promise<void> {
  await param(page, key, form).fill(text);
  if (readBack === null) return;
  await expectText(fieldOf(page, key, form).locator('output'), readBack);
}
