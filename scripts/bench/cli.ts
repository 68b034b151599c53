/**
 * The whole CLI process beside ngspice, doing the same work: the CLI analyses the bench
 * chain and writes its full sweep (step-up at every node and Zin, every point) to a file;
 * ngspice runs the exported netlist of the same chain and writes every node's voltage at
 * every point to its data file. Each side's exit status and output are checked before its
 * time counts. The CLI runs as it ships: its launcher (dist/analyze) starts Node from the V8
 * start-up snapshot of the esbuild bundle (dist/analyze.blob of dist/analyze.js); at 2,001
 * points the bundle started without the snapshot is printed beside it.
 *
 * Targets: at 2,001 points the CLI is no slower than `ngspice -b` on the exported netlist;
 * at 100,000 points it is at least 3× faster than ngspice's own AC solver (constant-resistor
 * netlist) and peaks at no more than 1.5× ngspice's resident memory. The 3× is judged on two
 * pairs that each do the same work on both sides, never across them: solver against solver
 * (the AC analysis time ngspice reports against the solve time the CLI reports with
 * --timing: every node's voltage and impedance at every point, both measured inside the
 * process; the CLI's whole analysis, which adds its findings, is printed beside it, not
 * judged) and whole process
 * against whole process (start-up, solve and every point written, on both sides).
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
  /** The engine's analysis alone, as the CLI's --timing reports it. */
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

function cli(dir: string, start: Start, chainFile: string, rows: number): CliRun {
  const outFile = join(dir, 'cli.out');
  const args = [chainFile, '--sweep', '--timing'];
  const run =
    'launcher' in start
      ? runProcess(start.launcher, args, dir, outFile)
      : runProcess(process.execPath, [start.bundle, ...args], dir, outFile, launcherEnv());
  if (run.status !== 0) throw new Error(`the CLI exited with status ${run.status}: ${run.stderr}`);
  // The budget table, then "Sweep", a header and one line per point.
  const lines = lineCount(outFile);
  if (lines < rows + 2) throw new Error(`the CLI wrote ${lines} lines for ${rows} sweep points`);
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
        const cliRuns: CliRun[] = [];
        const plainRuns: CliRun[] = [];
        const exported: SpiceRun[] = [];
        const constant: SpiceRun[] = [];
        for (let r = 0; r < reps; r++) {
          cliRuns.push(cli(dir, shipped, chainFile, points));
          if (points === 2001) plainRuns.push(cli(dir, { bundle }, chainFile, points));
          if (points <= 10_000 || r === 0) {
            exported.push(spice(dir, decks.exported, decks.dataFile, points, decks.columns));
          }
          constant.push(spice(dir, decks.constantR, decks.dataFile, points, decks.columns));
        }
        const cliMs = medianOf(cliRuns, (r) => r.wallMs);
        const cliCpu = medianOf(cliRuns, (r) => r.cpuMs);
        const exCpu = medianOf(exported, (r) => r.cpuMs);
        const coCpu = medianOf(constant, (r) => r.cpuMs);
        const cliAnalysisMs = medianOf(cliRuns, (r) => r.analysisMs);
        const cliSolveMs = medianOf(cliRuns, (r) => r.solveMs);
        const cliPeak = medianOf(cliRuns, (r) => r.peakBytes);
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
          `whole CLI (dist/analyze --sweep: node from its start-up snapshot, every node written), ${n} points: whole / CPU / analysis / peak`,
          `${ms(cliMs)} / ${ms(cliCpu)} / ${ms(cliAnalysisMs)} / ${mib(cliPeak)}`,
        );
        if (plainRuns.length > 0) {
          ctx.row(
            `the same without the start-up snapshot (node dist/analyze.js, in the launcher's environment), ${n} points: whole / CPU / analysis / peak`,
            `${ms(medianOf(plainRuns, (r) => r.wallMs))} / ${ms(medianOf(plainRuns, (r) => r.cpuMs))} / ${ms(medianOf(plainRuns, (r) => r.analysisMs))} / ${mib(medianOf(plainRuns, (r) => r.peakBytes))}`,
          );
        }
        if (points === 2001) {
          ctx.row(
            `whole process vs whole process: CLI ÷ ngspice -b on the exported netlist, ${n} points`,
            `${(cliMs / exMs).toFixed(2)}×`,
            '≤ 1× (no slower)',
            verdict(cliMs <= exMs),
          );
          // Under load the wall times are mostly waits for a core; the CPU each side used is
          // the steadier comparison, printed beside the verdict (which stays on wall time).
          ctx.row(
            `CPU vs CPU: CLI ÷ ngspice -b on the exported netlist, ${n} points (user + system, all threads)`,
            `${(cliCpu / exCpu).toFixed(2)}×`,
          );
        } else {
          // Like for like: ngspice's AC analysis solves every node's voltage at every point, as
          // the CLI's solve does. The CLI's whole analysis adds resonances, edges, selectivity,
          // noise and flags: printed beside it, not judged. A CLI that does not report its
          // solve is judged on its whole analysis, and the row says so.
          const solved = Number.isFinite(cliSolveMs);
          const solver = coAc / (solved ? cliSolveMs : cliAnalysisMs);
          ctx.row(
            solved
              ? `solver vs solver: ngspice's AC analysis (constant resistors) ÷ the CLI's solve (${ms(cliSolveMs)}: every node's voltage and impedance at every point), ${n} points`
              : `solver vs solver: ngspice's AC analysis (constant resistors) ÷ the CLI's whole analysis (the CLI reported no solve time), ${n} points`,
            `${solver.toFixed(1)}× faster`,
            '≥ 3× faster',
            verdict(solver >= 3),
          );
          if (solved) {
            ctx.row(
              `not judged: ngspice's AC analysis ÷ the CLI's whole analysis (${ms(cliAnalysisMs)}: the solve, resonances, edges, selectivity, noise, flags), ${n} points`,
              `${(coAc / cliAnalysisMs).toFixed(1)}×`,
            );
          }
          const whole = coMs / cliMs;
          ctx.row(
            `whole process vs whole process: ngspice -b (constant resistors) ÷ the whole CLI, ${n} points`,
            `${whole.toFixed(1)}× faster`,
            '≥ 3× faster',
            verdict(whole >= 3),
          );
          ctx.row(
            `CPU vs CPU: ngspice -b (constant resistors) ÷ the whole CLI, ${n} points (user + system, all threads)`,
            `${(coCpu / cliCpu).toFixed(1)}× faster`,
          );
          ctx.row(
            `CLI peak memory ÷ ngspice's (constant resistors), ${n} points`,
            `${(cliPeak / coPeak).toFixed(2)}×`,
            '≤ 1.5×',
            verdict(cliPeak / coPeak <= 1.5),
          );
        }
      }
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  },
};
