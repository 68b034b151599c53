/**
 * Two polling matchers, so a test reads as a list of expectations while still waiting for
 * the asynchronous page: a locator's count, and a locator becoming visible.
 */
import type { Locator } from 'playwright-core';
import { waitUntil } from './wait';

expect.extend({
  async toHaveCountEventually(locator: Locator, count: number) {
    let seen = 0;
    try {
      await waitUntil(async () => {
        seen = await locator.count();
        return seen === count;
      }, `${count} items`);
      return { pass: true, message: () => `expected not ${count}` };
    } catch {
      return { pass: false, message: () => `expected ${count} items, found ${seen}` };
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
