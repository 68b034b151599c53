/**
 * Figures the browser tests leave in test-results/, read, not measured here (a row says
 * "not measured" when no browser run has written its file):
 * - edit → updated plot with the Plots tab open (edit-to-plot.json, test/browser/plots.e2e.ts),
 *   the editor's speed target;
 * - the click on the Plots tab → the first plot painted (first-plot.json, the same test);
 * - edit → rendered results over the editing scenario of test/browser/editor.e2e.ts
 *   (edit-to-render.json), with the target that file states.
 * Each row names when the browser run was and the load average it saw.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { median } from './measure';
import { measuredWhen, ms, verdict, type BenchContext, type BenchSection } from './rows';

/** Median edit → updated plot, ms. */
const EDIT_TO_PLOT_TARGET_MS = 100;
/** Median click on the Plots tab → first plot painted, ms. */
const FIRST_PLOT_TARGET_MS = 400;

interface BrowserFigure {
  medianMs: number;
  targetMs?: number;
  /** When and under what load the browser run took it. */
  note: string;
}

/** Reads a figure file of the last browser run; a string says why there is no figure. */
function readBrowserFigure(file: string): BrowserFigure | string {
  if (!existsSync(file)) return 'not measured';
  let data: Record<string, unknown>;
  try {
    data = JSON.parse(readFileSync(file, 'utf8')) as Record<string, unknown>;
  } catch (e) {
    return `unreadable (${(e as Error).message})`;
  }
  const samples = Array.isArray(data.samplesMs)
    ? data.samplesMs.filter((v): v is number => typeof v === 'number')
    : [];
  const value =
    typeof data.medianMs === 'number'
      ? data.medianMs
      : samples.length > 0
        ? median(samples)
        : undefined;
  if (value === undefined) return 'file has no medianMs or samplesMs';
  const when = measuredWhen(file, data);
  const load = typeof data.load === 'number' ? `, load ${data.load.toFixed(2)} then` : '';
  return {
    medianMs: value,
    targetMs: typeof data.targetMs === 'number' ? data.targetMs : undefined,
    note: `${when} UTC${load}`,
  };
}

function figureRow(
  ctx: BenchContext,
  file: string,
  figure: string,
  fallbackTargetMs: number,
  rerun: string,
): void {
  const read = readBrowserFigure(join(ctx.root, 'test-results', file));
  if (typeof read === 'string') {
    return ctx.row(figure, `${read} (run ${rerun})`, `≤ ${fallbackTargetMs} ms`);
  }
  const target = read.targetMs ?? fallbackTargetMs;
  ctx.row(
    `${figure} (${read.note})`,
    ms(read.medianMs),
    `≤ ${target} ms`,
    verdict(read.medianMs <= target),
  );
}

export const editorSection: BenchSection = {
  name: 'editor',
  run(ctx: BenchContext) {
    figureRow(
      ctx,
      'edit-to-plot.json',
      'edit → updated plot, Plots open, median (last browser run)',
      EDIT_TO_PLOT_TARGET_MS,
      'test/browser/plots.e2e.ts',
    );
    figureRow(
      ctx,
      'first-plot.json',
      'click on Plots → first plot painted, median (last browser run)',
      FIRST_PLOT_TARGET_MS,
      'test/browser/plots.e2e.ts',
    );
    figureRow(
      ctx,
      'edit-to-render.json',
      'edit → rendered results, editing scenario, median (last browser run)',
      150,
      'test/browser/editor.e2e.ts',
    );
  },
};
