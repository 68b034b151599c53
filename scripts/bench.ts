/**
 * The benchmark: every capacity figure with its target, PASS or MISS, and the load average
 * when it was taken.
 *
 *   npm run bench                       every section
 *   npm run bench -- --quick            fewer repetitions (noisier figures)
 *   npm run bench -- --only engine,cli  some sections (names in scripts/bench/sections.ts)
 *
 * Figures are medians of wall time; they vary with the machine's load, which is why each
 * row states it, and no test asserts them. `npm run bench` runs this file as an esbuild
 * bundle (dist/bench.js), as the CLI ships: under a TypeScript loader every imported
 * function in a hot loop is reached through an interop getter.
 */
import { cpus, loadavg } from 'node:os';
import { dirname, join } from 'node:path';
import { existsSync } from 'node:fs';
import { alignColumns } from '../shared/io/budget-text';
import { loadNow, type BenchContext, type BenchRow, type Verdict } from './bench/rows';
import { SECTIONS } from './bench/sections';

/** The project root: the nearest folder above this file with a package.json (this file runs from dist/). */
function projectRoot(from: string): string {
  let dir = from;
  while (!existsSync(join(dir, 'package.json')) && dirname(dir) !== dir) dir = dirname(dir);
  return dir;
}

function option(name: string): string | undefined {
  const i = process.argv.indexOf(name);
  return i >= 0 ? process.argv[i + 1] : undefined;
}

async function main(): Promise<void> {
  const quick = process.argv.includes('--quick');
  const only = option('--only')?.split(',');
  const unknown = only?.filter((n) => !SECTIONS.some((s) => s.name === n)) ?? [];
  if (unknown.length > 0) {
    throw new Error(
      `no bench section ${unknown.join(', ')}; sections: ${SECTIONS.map((s) => s.name).join(', ')}`,
    );
  }
  const rows: { section: string; row: BenchRow }[] = [];
  let current = '';
  const ctx: BenchContext = {
    quick,
    root: projectRoot(__dirname),
    row(figure: string, value: string, target = '—', verdict: Verdict = '') {
      rows.push({ section: current, row: { figure, value, target, verdict, load: loadNow() } });
    },
  };
  const started = loadavg();
  for (const section of SECTIONS) {
    if (only && !only.includes(section.name)) continue;
    current = section.name;
    try {
      await section.run(ctx);
    } catch (e) {
      ctx.row(`${section.name}: failed`, e instanceof Error ? e.message : String(e), '—', 'MISS');
    }
  }
  const table = alignColumns([
    ['Figure', 'Value', 'Target', '', 'Load'],
    ...rows.map(({ section, row }) => [
      `${section}: ${row.figure}`,
      row.value,
      row.target,
      row.verdict,
      row.load.toFixed(1),
    ]),
  ]);
  const misses = rows.filter((r) => r.row.verdict === 'MISS').length;
  const targets = rows.filter((r) => r.row.verdict !== '').length;
  process.stdout.write(
    `Chainwright benchmark (node ${process.version}; ${quick ? 'quick' : 'full'} run; ` +
      `${cpus().length} cores; load average ${started.map((l) => l.toFixed(1)).join(' ')} at the ` +
      `start; "Load" is the 1-minute load average when each figure was taken)\n\n` +
      `${table}\n\n${targets - misses} of ${targets} targets met.\n`,
  );
}

main().catch((e: unknown) => {
  process.stderr.write(`bench: ${e instanceof Error ? e.message : String(e)}\n`);
  process.exitCode = 1;
});
