/**
 * Accessibility check for the browser tests: injects axe-core (the installed package's
 * axe.min.js, nothing fetched) into the page and runs it. Violations of impact "serious" or
 * "critical" are returned as readable lines, so a test can assert the list is empty.
 */
import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { overlaysSettled } from './wait';

const AXE_SOURCE = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');

/** One axe violation, shortened to what a person needs to find and fix it. */
export interface AxeProblem {
  id: string;
  impact: string;
  help: string;
  targets: string[];
}

interface AxeResults {
  violations: {
    id: string;
    impact: string | null;
    help: string;
    nodes: { target: unknown[] }[];
  }[];
}

interface AxeGlobal {
  axe: {
    run(
      context: unknown,
      options: { resultTypes: string[]; runOnly?: unknown },
    ): Promise<AxeResults>;
  };
  document: unknown;
}

/** Runs axe on the whole page; returns the serious and critical violations. */
export async function seriousAxeViolations(page: Page): Promise<AxeProblem[]> {
  // addScriptTag with content inserts an inline script, which the app's CSP forbids; the
  // page-level evaluate of the source runs in the page's own world, past the CSP.
  const loaded = await page.evaluate(() => 'axe' in globalThis);
  if (!loaded) await page.evaluate(AXE_SOURCE);
  const results = await page.evaluate(async () => {
    const g = globalThis as unknown as AxeGlobal;
    const r = await g.axe.run(g.document, { resultTypes: ['violations'] });
    return r.violations.map((v) => ({
      id: v.id,
      impact: v.impact ?? 'unknown',
      help: v.help,
      targets: v.nodes.slice(0, 5).map((n) => JSON.stringify(n.target)),
    }));
  });
  return results.filter((v) => v.impact === 'serious' || v.impact === 'critical');
}

/** Readable lines for a failing expectation. */
export function describeAxe(problems: AxeProblem[]): string[] {
  return problems.map((p) => `${p.impact} ${p.id}: ${p.help} at ${p.targets.join(', ')}`);
}

/**
 * How far the page scrolls sideways: its scroll width beyond the window's width. The width is
 * the one the test set: on a phone (a mobile viewport) Chromium widens the layout viewport,
 * and with it innerWidth, to fit content that overflows, so innerWidth alone hides it.
 */
export async function horizontalOverflow(page: Page): Promise<number> {
  const set = page.viewportSize()?.width ?? Infinity;
  const { scrollWidth, innerWidth } = await page.evaluate(() => {
    const g = globalThis as unknown as {
      document: { scrollingElement: { scrollWidth: number } | null };
      innerWidth: number;
    };
    return { scrollWidth: g.document.scrollingElement?.scrollWidth ?? 0, innerWidth: g.innerWidth };
  });
  return scrollWidth - Math.min(innerWidth, set);
}

/**
 * The check made on every screen a test visits: no sideways page overflow and no serious or
 * critical axe violation. Failures are added to `problems` (named by `screen`), so one run
 * reports every screen that fails instead of stopping at the first.
 */
export async function checkScreen(page: Page, screen: string, problems: string[]): Promise<void> {
  // An overlay still fading in blends the text under it: judge the screen once it is still.
  // A panel that never settles (none known) leaves the check to judge the screen as it is.
  await overlaysSettled(page, 5000).catch(() => undefined);
  const overflow = await horizontalOverflow(page);
  if (overflow > 0) problems.push(`${screen}: the page is ${overflow} px wider than the window`);
  for (const line of describeAxe(await seriousAxeViolations(page))) {
    problems.push(`${screen}: ${line}`);
  }
}
