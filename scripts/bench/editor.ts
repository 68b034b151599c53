/**
 * Figures the browser tests leave in test-results/: the editor's edit→render time (written
 * by test/browser/editor.e2e.ts). Read, not measured here: the row says "not measured" when
 * no browser run has written the file.
 */
import { existsSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { median } from './measure';
import { ms, verdict, type BenchContext, type BenchSection } from './rows';

/** The target when the file states none, ms (median edit → updated plot). */
const EDIT_TO_RENDER_TARGET_MS = 100;

export const editorSection: BenchSection = {
  name: 'editor',
  run(ctx: BenchContext) {
    const file = join(ctx.root, 'test-results', 'edit-to-render.json');
    const figure = 'editor edit→render, median (from the last browser run)';
    const target = `≤ ${EDIT_TO_RENDER_TARGET_MS} ms`;
    if (!existsSync(file)) return ctx.row(figure, 'not measured', target);
    try {
      const data = JSON.parse(readFileSync(file, 'utf8')) as Record<string, unknown>;
      const samples = Array.isArray(data.samplesMs)
        ? data.samplesMs.filter((v): v is number => typeof v === 'number')
        : [];
      const value =
        typeof data.medianMs === 'number'
          ? data.medianMs
          : samples.length > 0
            ? median(samples)
            : undefined;
      if (value === undefined) return ctx.row(figure, 'file has no medianMs or samplesMs', target);
      const when = statSync(file).mtime.toISOString().slice(0, 16).replace('T', ' ');
      ctx.row(
        `${figure}, ${when} UTC`,
        ms(value),
        target,
        verdict(value <= EDIT_TO_RENDER_TARGET_MS),
      );
    } catch (e) {
      ctx.row(figure, `unreadable (${(e as Error).message})`, target);
    }
  },
};
