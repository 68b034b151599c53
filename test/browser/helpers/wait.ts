/**
 * Bounded polling for the browser tests: the app renders asynchronously (analyses run on
 * the server, Angular updates after), so a test waits for the value it expects instead of
 * reading the page at once. Each helper gives up after a deadline with the last value seen;
 * the 30 s default is generous because the machine running the tests may be shared and
 * loaded, and a wait ends as soon as its condition holds.
 */
import type { Locator, Page } from 'playwright-core';

/** Polls `check` every 100 ms until it holds; throws naming `what` after `timeoutMs`. */
export async function waitUntil(
  check: () => Promise<boolean>,
  what: string,
  timeoutMs = 30000,
): Promise<void> {
  const end = Date.now() + timeoutMs;
  while (Date.now() < end) {
    if (await check()) return;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`timed out waiting for ${what}`);
}

/** Waits until the first element's text content contains `text`. */
export async function expectText(locator: Locator, text: string, timeoutMs = 30000): Promise<void> {
  let seen = '';
  try {
    await waitUntil(
      async () => {
        seen = (await locator.first().textContent()) ?? '';
        return seen.includes(text);
      },
      `"${text}"`,
      timeoutMs,
    );
  } catch {
    throw new Error(`"${text}" did not appear; the text was: ${seen.slice(0, 600)}`);
  }
}

/** Waits until the rendered text of all matching elements, joined, contains `text`. */
export async function textAppears(where: Locator, text: string, timeoutMs = 20000): Promise<void> {
  let seen = '';
  try {
    await waitUntil(
      async () => {
        seen = (await where.allInnerTexts()).join('\n');
        return seen.includes(text);
      },
      `"${text}"`,
      timeoutMs,
    );
  } catch {
    throw new Error(`"${text}" did not appear; the text was: ${seen.slice(0, 600)}`);
  }
}

/** Waits until an input's value is exactly `text`. */
export async function expectValue(input: Locator, text: string, timeoutMs = 20000): Promise<void> {
  let value = '';
  try {
    await waitUntil(
      async () => {
        value = await input.inputValue();
        return value === text;
      },
      `the value "${text}"`,
      timeoutMs,
    );
  } catch {
    throw new Error(`expected the value "${text}", got "${value}"`);
  }
}

/**
 * Waits until every open overlay panel (menu, select, autocomplete) has finished its entry
 * animation: until then the panel is partly transparent over the page, and an accessibility
 * check would judge the text under it against a blended background.
 */
export async function overlaysSettled(page: Page, timeoutMs = 10000): Promise<void> {
  await page.waitForFunction(
    () =>
      [...document.querySelectorAll<HTMLElement>('.cdk-overlay-pane > *')].every((panel) => {
        const style = getComputedStyle(panel);
        const still = ['none', '', 'matrix(1, 0, 0, 1, 0, 0)'].includes(style.transform);
        return style.opacity === '1' && still;
      }),
    undefined,
    { timeout: timeoutMs },
  );
}
