/** The chain list as the browser tests use it. */
import type { Page } from 'playwright-core';
import { waitUntil } from './wait';

/**
 * Types `text` into the chain list's filter and waits for the filtered list: the filter
 * asks the server after a pause in typing, and until its answer the old rows stay on the
 * page dimmed (an accessibility check would judge their faded text, a click could hit a row
 * about to go). Settled means no request in flight, the table at full opacity, and every
 * row matching the filter.
 */
export async function filterChains(page: Page, text: string): Promise<void> {
  await page.getByLabel('Filter by name or description').fill(text);
  const wanted = text.toLowerCase();
  await waitUntil(
    () =>
      page.evaluate((wanted) => {
        const wrap = document.querySelector<HTMLElement>('.cw-table-wrap');
        if (!wrap || wrap.classList.contains('cw-loading')) return false;
        if (getComputedStyle(wrap).opacity !== '1') return false;
        const rows = [...wrap.querySelectorAll<HTMLElement>('.mat-mdc-row')];
        return rows.every((row) => row.innerText.toLowerCase().includes(wanted));
      }, wanted),
    `the chain list filtered by "${text}"`,
  );
}

/**
 * Opens a chain from the list through its name filter, so the chain is found however many
 * chains earlier tests added (the list shows a page at a time, the latest first).
 */
export async function openChainNamed(page: Page, name: string): Promise<void> {
  await filterChains(page, name);
  await page.getByRole('link', { name, exact: true }).click();
  await page.waitForURL(/\/chains\/[^/]+$/);
}
