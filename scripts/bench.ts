/**
 * Benchmark of the analysis engine, printed as a table of figures with their targets.
 *
 *   npm run bench            (add --quick for fewer repetitions)
 *
 * (a) node analysis of a 12-two-port chain over 2001 points, in process (target ≤ 1 ms);
 * (b) the full analyzeChain (resonator Q, selectivity, noise, flags) over the same sweep;
 * (c) heap allocated per analysis;
 * (d) the same chain over 100,000 points beside ngspice: the engine's analysis time vs the
 *     analysis time ngspice reports (`rusage`), target ≥ 10× less; and the whole CLI process
 *     (`node dist/analyze.js`, an esbuild bundle made first) vs the whole `ngspice -b`
 *     process, target ≥ 2× less;
 * (e) the editor's edit→render time in a browser, read from test-results/edit-to-render.json
 *     when the editor's browser test has written it.
 * Timings are medians; they vary with the machine's load and are never asserted by tests.
 * `npm run bench` runs this file as an esbuild bundle (dist/bench.js), as the CLI ships:
 * under a TypeScript loader every imported function in the hot loop is reached through an
 * interop getter, which roughly doubles the node-analysis time.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { analyzeBuilt, analyzeChain } from '../shared/engine/analyze';
import { buildChain } from '../shared/engine/core/build';
import { createNodeAnalysis, runNodeAnalysis } from '../shared/engine/core/nodes';
import { frequencyGrid } from '../shared/engine/core/sweep';
import { STAGE_DEFINITIONS } from '../shared/engine/stages';
import { chainToSpiceDeck } from '../shared/engine/spice/netlist';
import { parseRusage } from '../shared/engine/spice/output';
import { alignColumns } from '../shared/io/budget-text';
import { benchChain } from './bench/bench-chain';
import { bundleCli } from './bench/bundle-cli';
import { allocatedBytes, median, medianMs, timeMs, timings } from './bench/measure';

const ROOT = join(__dirname, '..');
const quick = process.argv.includes('--quick');
const catalogue = STAGE_DEFINITIONS;

interface Row {
  figure: string;
  value: string;
  target: string;
  verdict: 'PASS' | 'MISS' | '';
}
const rows: Row[] = [];
const ms = (v: number) => `${v < 1 ? v.toFixed(3) : v.toFixed(1)} ms`;
const kib = (b: number) => `${(b / 1024).toFixed(1)} KiB`;
const verdict = (ok: boolean): Row['verdict'] => (ok ? 'PASS' : 'MISS');

// ---------------------------------------------------------------- (a)–(c) in process
const doc2001 = benchChain(2001);
const built = buildChain(doc2001, catalogue);
const freqs = frequencyGrid(built.settings.sweep);
const ws = createNodeAnalysis(built, freqs.length);
const node = timings(() => runNodeAnalysis(built, freqs, ws), quick ? 50 : 400);
const nodeMs = node.median;
rows.push({
  figure: `(a) node analysis, ${built.twoPorts.length} two-ports (${built.sections.length} sections) × 2001 points`,
  value: `${ms(nodeMs)} (fastest ${ms(node.best)})`,
  target: '≤ 1 ms',
  verdict: verdict(nodeMs <= 1),
});
const fullMs = medianMs(() => analyzeChain(doc2001, { catalogue }), quick ? 10 : 40, 5);
rows.push({
  figure: '(b) full analyzeChain (validate, build, Q, selectivity, noise, flags), 2001 points',
  value: ms(fullMs),
  target: '—',
  verdict: '',
});
const builtMs = medianMs(() => analyzeBuilt(built), quick ? 10 : 40, 5);
rows.push({
  figure: '    of which analysis of the built chain',
  value: ms(builtMs),
  target: '—',
  verdict: '',
});
const nodeAlloc = allocatedBytes(() => runNodeAnalysis(built, freqs, ws));
rows.push({
  figure: '(c) allocated per node analysis (workspace reused): JS heap + buffers',
  value: `${kib(nodeAlloc.heap)} + ${kib(nodeAlloc.buffers)}`,
  target: '—',
  verdict: '',
});
const fullAlloc = allocatedBytes(() => analyzeChain(doc2001, { catalogue }), quick ? 5 : 15);
rows.push({
  figure: '    allocated per full analyzeChain: JS heap + buffers',
  value: `${kib(fullAlloc.heap)} + ${kib(fullAlloc.buffers)}`,
  target: '—',
  verdict: '',
});

// ---------------------------------------------------------------- (d) beside ngspice
const POINTS = 100_000;
const docBig = benchChain(POINTS);
const builtBig = buildChain(docBig, catalogue);
const freqsBig = frequencyGrid(builtBig.settings.sweep);
const wsBig = createNodeAnalysis(builtBig, POINTS);
const bigNodeMs = medianMs(() => runNodeAnalysis(builtBig, freqsBig, wsBig), quick ? 3 : 15, 2);
const bigFullMs = medianMs(() => analyzeChain(docBig, { catalogue }), quick ? 2 : 5, 1);

const dir = mkdtempSync(join(tmpdir(), 'cw-bench-'));
try {
  const deck = chainToSpiceDeck(docBig, { catalogue });
  writeFileSync(join(dir, 'chain.cir'), deck.netlist.replace(/^rusage$/m, 'rusage all'));
  const chainFile = join(dir, 'chain.json');
  writeFileSync(chainFile, JSON.stringify(docBig));
  const spiceRuns: { wall: number; analysis?: number; ac?: number }[] = [];
  for (let i = 0; i < (quick ? 1 : 3); i++) {
    let out = '';
    const wall = timeMs(() => {
      const p = spawnSync('ngspice', ['-b', 'chain.cir'], {
        cwd: dir,
        encoding: 'utf8',
        maxBuffer: 1 << 26,
      });
      if (p.error)
        throw new Error(
          `ngspice could not run (${p.error.message}): install Debian's ngspice: apt-get install -y ngspice`,
        );
      out = p.stdout;
    });
    const t = parseRusage(out);
    spiceRuns.push({
      wall,
      analysis: t.analysisS === undefined ? undefined : t.analysisS * 1e3,
      ac: t.acS === undefined ? undefined : t.acS * 1e3,
    });
  }
  const spiceAnalysis = median(spiceRuns.map((r) => r.analysis ?? NaN));
  const spiceAc = median(spiceRuns.map((r) => r.ac ?? NaN));
  const spiceWall = median(spiceRuns.map((r) => r.wall));
  rows.push({
    figure: `(d) ngspice analysis time it reports (rusage), ${POINTS} points: total / AC`,
    value: `${ms(spiceAnalysis)} / ${ms(spiceAc)}`,
    target: '—',
    verdict: '',
  });
  rows.push({
    figure: `    engine node analysis, ${POINTS} points`,
    value: `${ms(bigNodeMs)} (${(spiceAnalysis / bigNodeMs).toFixed(0)}× less)`,
    target: '≥ 10× less',
    verdict: verdict(spiceAnalysis / bigNodeMs >= 10),
  });
  rows.push({
    figure: `    engine full analyzeChain, ${POINTS} points`,
    value: `${ms(bigFullMs)} (${(spiceAnalysis / bigFullMs).toFixed(1)}× less)`,
    target: '≥ 10× less',
    verdict: verdict(spiceAnalysis / bigFullMs >= 10),
  });

  const bundle = bundleCli(join(ROOT, 'dist', 'analyze.js'));
  const cliRuns = Array.from({ length: quick ? 1 : 3 }, () =>
    timeMs(() => {
      const p = spawnSync(process.execPath, [bundle, chainFile], {
        encoding: 'utf8',
        maxBuffer: 1 << 26,
      });
      if (p.status !== 0) throw new Error(`the CLI failed: ${p.stderr}`);
    }),
  );
  const cliWall = median(cliRuns);
  rows.push({
    figure: `    whole ngspice -b process (netlist in, table out), ${POINTS} points`,
    value: ms(spiceWall),
    target: '—',
    verdict: '',
  });
  rows.push({
    figure: '    whole CLI process: node dist/analyze.js <chain> (esbuild bundle)',
    value: `${ms(cliWall)} (${(spiceWall / cliWall).toFixed(1)}× less)`,
    target: '≥ 2× less',
    verdict: verdict(spiceWall / cliWall >= 2),
  });
} finally {
  rmSync(dir, { recursive: true, force: true });
}

// ---------------------------------------------------------------- (e) browser figure
rows.push(editToRender());

/**
 * Reads `test-results/edit-to-render.json`, written by the editor's browser test:
 * `{ "medianMs": number, "samplesMs"?: number[], "targetMs"?: number }` (a median is taken
 * from `samplesMs` when `medianMs` is absent).
 */
function editToRender(): Row {
  const file = join(ROOT, 'test-results', 'edit-to-render.json');
  const figure = '(e) editor edit→render (browser)';
  if (!existsSync(file)) return { figure, value: 'not measured', target: '—', verdict: '' };
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
    const target = typeof data.targetMs === 'number' ? data.targetMs : undefined;
    if (value === undefined) {
      return { figure, value: 'file has no medianMs or samplesMs', target: '—', verdict: '' };
    }
    return {
      figure,
      value: ms(value),
      target: target === undefined ? '—' : `≤ ${target} ms`,
      verdict: target === undefined ? '' : verdict(value <= target),
    };
  } catch (e) {
    return { figure, value: `unreadable (${(e as Error).message})`, target: '—', verdict: '' };
  }
}

process.stdout.write(
  `Chainwright benchmark (node ${process.version}; medians; ${quick ? 'quick' : 'full'} run; ` +
    `load average ${loadavg()
      .map((l) => l.toFixed(1))
      .join(' ')} on ${cpus().length} cores)\n\n` +
    alignColumns([
      ['Figure', 'Value', 'Target', ''],
      ...rows.map((r) => [r.figure, r.value, r.target, r.verdict]),
    ]) +
    '\n',
);
