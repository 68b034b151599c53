/**
 * The value knob's update rate in the browser (written by test/browser/design.e2e.ts to
 * test-results/knob-rate.json while it turns a capacitor). Read, not measured here: the row
 * says "not measured" when no browser run has written the file.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { measuredWhen, verdict, type BenchContext, type BenchSection } from './rows';

/** Live updates a second the knob must reach while a value turns. */
const KNOB_TARGET_PER_S = 20;

export const knobSection: BenchSection = {
  name: 'knob',
  run(ctx: BenchContext) {
    const file = join(ctx.root, 'test-results', 'knob-rate.json');
    const figure =
      'editor knob, live analyses a second in a Web Worker (from the last browser run)';
    const target = `≥ ${KNOB_TARGET_PER_S}/s`;
    if (!existsSync(file)) return ctx.row(figure, 'not measured', target);
    try {
      const data = JSON.parse(readFileSync(file, 'utf8')) as {
        updatesPerSecond?: unknown;
        measuredAt?: unknown;
      };
      const rate = data.updatesPerSecond;
      if (typeof rate !== 'number') return ctx.row(figure, 'file has no updatesPerSecond', target);
      const when = measuredWhen(file, data);
      ctx.row(
        `${figure}, ${when} UTC`,
        `${rate.toFixed(0)}/s`,
        target,
        verdict(rate >= KNOB_TARGET_PER_S),
      );
    } catch (e) {
      ctx.row(figure, `unreadable: ${e instanceof Error ? e.message : String(e)}`, target);
    }
  },
};
