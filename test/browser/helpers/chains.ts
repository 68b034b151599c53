/** The chain list as the browser tests use it. */
import type { Page } from 'playwright-core';

/**
 * Opens a chain from the list through its name filter, so the chain is found however many
 * chains earlier tests added (the list shows a page at a time, the latest first).
 */
export async function openChainNamed(page: Page, name: string): Promise<void> {
  await page.getByLabel('Filter by name or description').fill(name);
  await page.getByRole('link', { name, exact: true }).click();
  await page.waitForURL(/\/chains\/[^/]+$/);
}
