/**
 * The whole CLI process beside ngspice, doing the same work: the CLI solves the bench chain's
 * sweep and writes it out in full (`--sweep-only`: step-up at every node and Zin, every
 * point) to a file; ngspice runs the exported netlist of the same chain and writes every
 * node's voltage at every point to its data file. The CLI's analysis with its sweep
 * (`--sweep`: the findings at f0 as well, work ngspice does not do) is timed beside it and
 * printed, not judged. Each side's exit status and output are checked before its
 * time counts. The CLI runs as it ships: its launcher (dist/analyze) starts Node from the V8
 * start-up snapshot of the esbuild bundle (dist/analyze.blob of dist/analyze.js); at 2,001
 * points the bundle started without the snapshot is printed beside it.
 *
 * Targets: at 2,001 points the CLI is no slower than `ngspice -b` on the exported netlist;
 * at 100,000 points it is at least 3× faster than ngspice's own AC solver (constant-resistor
 * netlist) and peaks at no more than 1.5× ngspice's resident memory. Each is judged on the
 * sweep alone, the work both sides do; the 3× on two pairs, never across them: solver against
 * solver (the AC analysis time ngspice reports against the solve time the CLI reports with
 * --timing: every node's voltage and impedance at every point, both measured inside the
 * process, both wall-clock; the CLI solves and writes its table a chunk of 4,096 points at a
 * time, and its solve is the chunks' solves added up, the writing between them left out, as
 * ngspice's AC time leaves out its writing) and whole process against whole process
 * (start-up, solve and every point written, on both sides). The CLI's analysis with its sweep, which adds its
 * findings and keeps more of the solve for them, is printed beside each, not judged.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseRusage } from '../../shared/engine';
import { parseChainDocument } from '../../shared/schema/parse-chain';
import { benchChain } from './bench-chain';
import { bundleCli, CLI_UNUSED_ENV, launcherPath } from './bundle-cli';
import { median } from './measure';
import { lineCount, runProcess, type ProcessRun } from './process';
import { mib, ms, verdict, type BenchContext, type BenchSection } from './rows';
import { benchDecks } from './spice-decks';

interface SpiceRun extends ProcessRun {
  acMs: number;
}

interface CliRun extends ProcessRun {
  /** The engine's analysis alone (with --sweep-only, the sweep alone), as --timing reports it. */
  analysisMs: number;
  /**
   * The solve alone (the sweep's node analysis: every node's voltage and impedance at every
   * point, what ngspice's AC analysis computes), when --timing reports it; NaN otherwise.
   */
  solveMs: number;
}

function spice(
  dir: string,
  netlist: string,
  dataFile: string,
  rows: number,
  columns: number,
): SpiceRun {
  writeFileSync(join(dir, 'chain.cir'), netlist);
  const run = runProcess('ngspice', ['-b', 'chain.cir'], dir, join(dir, 'ngspice.out'));
  if (run.status !== 0) {
    throw new Error(`ngspice exited with status ${run.status}: ${run.stderr.slice(-500)}`);
  }
  const lines = lineCount(join(dir, dataFile));
  if (lines !== rows + 1) {
    throw new Error(`ngspice wrote ${lines - 1} data rows, expected ${rows} (columns ${columns})`);
  }
  const out = readFileSync(join(dir, 'ngspice.out'), 'utf8');
  const t = parseRusage(out);
  return { ...run, acMs: t.acS === undefined ? NaN : t.acS * 1e3 };
}

/** How the CLI is started: its launcher (from the snapshot, as it ships) or the bundle alone. */
type Start = { launcher: string } | { bundle: string };

/** What the CLI is asked for: the sweep alone (like ngspice's work) or the analysis with it. */
type Work = '--sweep-only' | '--sweep';

function cli(dir: string, start: Start, chainFile: string, rows: number, work: Work): CliRun {
  const outFile = join(dir, 'cli.out');
  const args = [chainFile, work, '--timing'];
  const run =
    'launcher' in start
      ? runProcess(start.launcher, args, dir, outFile)
      : runProcess(process.execPath, [start.bundle, ...args], dir, outFile, launcherEnv());
  if (run.status !== 0) throw new Error(`the CLI exited with status ${run.status}: ${run.stderr}`);
  // A header and one line per point (with --sweep, after the budget table and "Sweep").
  const lines = lineCount(outFile);
  if (work === '--sweep-only' ? lines !== rows + 1 : lines < rows + 2) {
    throw new Error(`the CLI (${work}) wrote ${lines} lines for ${rows} sweep points`);
  }
  const analysis = /^timing: analysis ([0-9.]+) s$/m.exec(run.stderr);
  if (!analysis) throw new Error(`the CLI did not report its analysis time: ${run.stderr}`);
  const solve = /^timing: solve ([0-9.]+) s$/m.exec(run.stderr);
  return {
    ...run,
    analysisMs: Number(analysis[1]) * 1e3,
    solveMs: solve ? Number(solve[1]) * 1e3 : NaN,
  };
}

/**
 * The environment the launcher gives Node (without what it unsets), so the bundle started
 * without the snapshot differs from the launcher by the snapshot alone.
 */
function launcherEnv(): NodeJS.ProcessEnv {
  const env = { ...process.env };
  for (const name of CLI_UNUSED_ENV) delete env[name];
  return env;
}

const medianOf = <T>(runs: T[], pick: (r: T) => number) => median(runs.map(pick));

/** Medians of a side's runs. */
function mediansOf(runs: CliRun[]) {
  return {
    wallMs: medianOf(runs, (r) => r.wallMs),
    cpuMs: medianOf(runs, (r) => r.cpuMs),
    analysisMs: medianOf(runs, (r) => r.analysisMs),
    solveMs: medianOf(runs, (r) => r.solveMs),
    peakBytes: medianOf(runs, (r) => r.peakBytes),
  };
}

export const cliSection: BenchSection = {
  name: 'cli',
  async run(ctx: BenchContext) {
    const bundle = await bundleCli(join(ctx.root, 'dist', 'analyze.js'), { snapshot: true });
    const shipped: Start = { launcher: launcherPath(bundle) };
    const dir = mkdtempSync(join(tmpdir(), 'cw-bench-'));
    try {
      for (const points of [2001, 100_000]) {
        const doc = benchChain(points);
        const chainFile = join(dir, 'chain.json');
        writeFileSync(chainFile, JSON.stringify(doc));
        const decks = benchDecks(parseChainDocument(doc));
        // Three runs of each judged side at 100,000 points, so one run preempted by the load
        // does not decide a verdict; the exported netlist there (its behavioural resistors
        // take ngspice some 9 s) is judged nowhere and runs once.
        const reps = ctx.quick ? 1 : points > 10_000 ? 3 : 5;
        const sweepRuns: CliRun[] = [];
        const analysisRuns: CliRun[] = [];
        const plainRuns: CliRun[] = [];
        const exported: SpiceRun[] = [];
        const constant: SpiceRun[] = [];
        for (let r = 0; r < reps; r++) {
          sweepRuns.push(cli(dir, shipped, chainFile, points, '--sweep-only'));
          analysisRuns.push(cli(dir, shipped, chainFile, points, '--sweep'));
          if (points === 2001) plainRuns.push(cli(dir, { bundle }, chainFile, points, '--sweep-only')); // prettier-ignore
          if (points <= 10_000 || r === 0) {
            exported.push(spice(dir, decks.exported, decks.dataFile, points, decks.columns));
          }
          constant.push(spice(dir, decks.constantR, decks.dataFile, points, decks.columns));
        }
        const only = mediansOf(sweepRuns);
        const whole = mediansOf(analysisRuns);
        const exCpu = medianOf(exported, (r) => r.cpuMs);
        const coCpu = medianOf(constant, (r) => r.cpuMs);
        const exMs = medianOf(exported, (r) => r.wallMs);
        const exAc = medianOf(exported, (r) => r.acMs);
        const coMs = medianOf(constant, (r) => r.wallMs);
        const coAc = medianOf(constant, (r) => r.acMs);
        const coPeak = medianOf(constant, (r) => r.peakBytes);
        const exPeak = medianOf(exported, (r) => r.peakBytes);
        const n = points.toLocaleString('en-GB');
        ctx.row(
          `ngspice -b, exported netlist (every node written), ${n} points: whole / CPU / AC / peak`,
          `${ms(exMs)} / ${ms(exCpu)} / ${ms(exAc)} / ${mib(exPeak)}`,
        );
        ctx.row(
          `ngspice -b, constant-resistor netlist, ${n} points: whole / CPU / AC / peak`,
          `${ms(coMs)} / ${ms(coCpu)} / ${ms(coAc)} / ${mib(coPeak)}`,
        );
        ctx.row(
          `whole CLI, the sweep alone (dist/analyze --sweep-only: node from its start-up snapshot, every node written), ${n} points: whole / CPU / solve / peak`,
          `${ms(only.wallMs)} / ${ms(only.cpuMs)} / ${ms(only.solveMs)} / ${mib(only.peakBytes)}`,
        );
        ctx.row(
          `not judged: whole CLI, the analysis with its sweep (dist/analyze --sweep: the findings at f0 as well), ${n} points: whole / CPU / analysis / solve / peak`,
          `${ms(whole.wallMs)} / ${ms(whole.cpuMs)} / ${ms(whole.analysisMs)} / ${ms(whole.solveMs)} / ${mib(whole.peakBytes)}`,
        );
        if (plainRuns.length > 0) {
          const plain = mediansOf(plainRuns);
          ctx.row(
            `the sweep alone without the start-up snapshot (node dist/analyze.js, in the launcher's environment), ${n} points: whole / CPU / solve / peak`,
            `${ms(plain.wallMs)} / ${ms(plain.cpuMs)} / ${ms(plain.solveMs)} / ${mib(plain.peakBytes)}`,
          );
        }
        if (points === 2001) {
          ctx.row(
            `whole process vs whole process: CLI --sweep-only ÷ ngspice -b on the exported netlist, ${n} points`,
            `${(only.wallMs / exMs).toFixed(2)}×`,
            '≤ 1× (no slower)',
            verdict(only.wallMs <= exMs),
          );
          ctx.row(
            `not judged: the CLI's analysis with its sweep (--sweep) ÷ ngspice -b on the exported netlist, ${n} points`,
            `${(whole.wallMs / exMs).toFixed(2)}×`,
          );
          // Under load the wall times are mostly waits for a core; the CPU each side used is
          // the steadier comparison, printed beside the verdict (which stays on wall time).
          ctx.row(
            `CPU vs CPU: CLI --sweep-only ÷ ngspice -b on the exported netlist, ${n} points (user + system, all threads)`,
            `${(only.cpuMs / exCpu).toFixed(2)}×`,
          );
        } else {
          // Like for like: ngspice's AC analysis solves every node's voltage at every point, as
          // the CLI's solve does (every node's voltage and impedance, the user nodes' voltages
          // and the input's impedance kept for the table). A CLI that does not report its
          // solve is judged on its sweep's whole time, and the row says so.
          const solved = Number.isFinite(only.solveMs);
          const solver = coAc / (solved ? only.solveMs : only.analysisMs);
          ctx.row(
            solved
              ? `solver vs solver: ngspice's AC analysis (constant resistors) ÷ the CLI's solve (--sweep-only, ${ms(only.solveMs)}: every node's voltage and impedance at every point), ${n} points`
              : `solver vs solver: ngspice's AC analysis (constant resistors) ÷ the CLI's sweep alone (the CLI reported no solve time), ${n} points`,
            `${solver.toFixed(1)}× faster`,
            '≥ 3× faster',
            verdict(solver >= 3),
          );
          ctx.row(
            `not judged: ngspice's AC analysis ÷ the solve inside the CLI's analysis (--sweep, ${ms(whole.solveMs)}: it also keeps the resonator nodes' impedances) and ÷ that whole analysis (${ms(whole.analysisMs)}: the solve, resonances, edges, selectivity, noise, flags), ${n} points`,
            `${(coAc / whole.solveMs).toFixed(1)}× / ${(coAc / whole.analysisMs).toFixed(1)}×`,
          );
          ctx.row(
            `whole process vs whole process: ngspice -b (constant resistors) ÷ the whole CLI (--sweep-only), ${n} points`,
            `${(coMs / only.wallMs).toFixed(1)}× faster`,
            '≥ 3× faster',
            verdict(coMs / only.wallMs >= 3),
          );
          ctx.row(
            `not judged: ngspice -b (constant resistors) ÷ the CLI's analysis with its sweep (--sweep), ${n} points`,
            `${(coMs / whole.wallMs).toFixed(1)}× faster`,
          );
          ctx.row(
            `CPU vs CPU: ngspice -b (constant resistors) ÷ the whole CLI (--sweep-only), ${n} points (user + system, all threads)`,
            `${(coCpu / only.cpuMs).toFixed(1)}× faster`,
          );
          ctx.row(
            `CLI peak memory (--sweep-only) ÷ ngspice's (constant resistors), ${n} points`,
            `${(only.peakBytes / coPeak).toFixed(2)}×`,
            '≤ 1.5×',
            verdict(only.peakBytes / coPeak <= 1.5),
          );
          ctx.row(
            `not judged: the CLI's analysis with its sweep (--sweep), peak memory ÷ ngspice's, ${n} points`,
            `${(whole.peakBytes / coPeak).toFixed(2)}×`,
          );
        }
      }
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  },
};
