/**
 * Times what a person sees, from outside the app: from a gesture (the click that opens the
 * Plots tab, or the input event of an edit) to the animation frame that paints the first
 * plot's traces drawn anew. The gesture's time is the browser's own event time stamp, and
 * the plot is watched in the DOM, so the figure does not depend on the app's own marks.
 */
import type { Page } from 'playwright-core';

/** The gesture that starts the clock. */
export type Gesture = 'click' | 'input';

interface ProbeElement {
  querySelectorAll(selector: string): ArrayLike<ProbeElement>;
  getAttribute(name: string): string | null;
}
interface ProbeEvent {
  timeStamp: number;
}
interface ProbeGlobal {
  document: ProbeElement & {
    body: ProbeElement;
    addEventListener(type: string, listener: (e: ProbeEvent) => void, capture: boolean): void;
    removeEventListener(type: string, listener: (e: ProbeEvent) => void, capture: boolean): void;
  };
  MutationObserver: new (callback: () => void) => {
    observe(target: ProbeElement, options: Record<string, unknown>): void;
    disconnect(): void;
  };
  requestAnimationFrame(callback: () => void): number;
  cwPlotProbe?: { startedAt: number | null; shownAt: number | null };
}

/**
 * Arms the probe before the gesture: the next `gesture` event starts the clock, and the first
 * change of the first plot's trace lines after it (their appearance, when the tab opens)
 * stops it at the next animation frame.
 */
export async function armPlotProbe(page: Page, gesture: Gesture): Promise<void> {
  await page.evaluate((type) => {
    const g = globalThis as unknown as ProbeGlobal;
    const probe: { startedAt: number | null; shownAt: number | null } = {
      startedAt: null,
      shownAt: null,
    };
    g.cwPlotProbe = probe;
    const lines = () =>
      Array.from(
        g.document.querySelectorAll(
          'cw-result-plot:first-of-type .scatterlayer .trace path.js-line',
        ),
        (path) => path.getAttribute('d') ?? '',
      ).join('|');
    let before = lines();
    const start = (e: ProbeEvent) => {
      probe.startedAt ??= e.timeStamp;
    };
    g.document.addEventListener(type, start, true);
    const observer = new g.MutationObserver(() => {
      const now = lines();
      // Plots taken off the page: whatever is drawn next is a new drawing, even of the
      // same traces.
      if (now === '') before = '';
      if (probe.startedAt === null || now === '' || now === before) return;
      observer.disconnect();
      g.document.removeEventListener(type, start, true);
      g.requestAnimationFrame(() => (probe.shownAt = performance.now()));
    });
    observer.observe(g.document.body, {
      subtree: true,
      childList: true,
      attributes: true,
      attributeFilter: ['d'],
    });
  }, gesture);
}

/** Waits for the armed probe to see the plot drawn and returns the time it took, ms. */
export async function readPlotProbe(page: Page): Promise<number> {
  try {
    const handle = await page.waitForFunction(
      () => {
        const probe = (globalThis as unknown as ProbeGlobal).cwPlotProbe;
        // In an array so that a duration of 0 still counts as an answer.
        return probe?.shownAt != null && probe.startedAt != null
          ? [probe.shownAt - probe.startedAt]
          : null;
      },
      undefined,
      { timeout: 30000 },
    );
    const [ms] = (await handle.jsonValue()) as [number];
    return Math.round(ms);
  } catch (e) {
    // Say what the probe saw: no gesture, or a gesture and no plot.
    const seen = await page.evaluate(() => {
      const g = globalThis as unknown as ProbeGlobal;
      const plots = g.document.querySelectorAll('cw-result-plot').length;
      return { ...g.cwPlotProbe, plots };
    });
    throw new Error(`${(e as Error).message}; the probe saw ${JSON.stringify(seen)}`);
  }
}

/** The middle value (the upper middle of an even count). */
export function medianOf(samples: number[]): number {
  const sorted = [...samples].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)];
}
