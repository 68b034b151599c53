/**
 * The engine in process, on the 12-two-port bench chain over 2,001 points with the sweep on:
 * the node analysis (time and allocation with a reused workspace), the full analysis
 * (`analyzeChain`: validation, build, f0, sweep, resonators, selectivity, noise, flags, the
 * sweep arrays) and the bare cascade of the same sections, measured in alternation so both
 * see the same load; the ratio of their medians is the figure. The sweep's traces are computed
 * when read (core/sweep-report.ts), so a further row times the analysis with every trace read.
 */
import {
  analyzeChain,
  buildChain,
  createNodeAnalysis,
  frequencyGrid,
  runNodeAnalysis,
  STAGE_DEFINITIONS,
  type AnalysisResult,
} from '../../shared/engine';
import { bareCascade } from './bare-cascade';
import { parseChainDocument } from '../../shared/schema/parse-chain';
import { benchChain } from './bench-chain';
import { allocatedBytes, median, timeMs, timings } from './measure';
import { kib, ms, verdict, type BenchContext, type BenchSection } from './rows';

const POINTS = 2001;
/** Allocation below this per node analysis counts as none (the measurement's own noise). */
const ALLOCATION_FREE_BYTES = 1024;

export const engineSection: BenchSection = {
  name: 'engine',
  run(ctx: BenchContext) {
    const catalogue = STAGE_DEFINITIONS;
    const doc = parseChainDocument(benchChain(POINTS));
    const built = buildChain(doc, catalogue);
    const freqs = frequencyGrid(built.settings.sweep);
    const size = `${built.twoPorts.length} two-ports (${built.sections.length} sections) × ${POINTS} points`;

    const ws = createNodeAnalysis(built, freqs.length);
    const node = timings(() => runNodeAnalysis(built, freqs, ws), ctx.quick ? 50 : 300);
    ctx.row(`node analysis, ${size}`, `${ms(node.median)} (fastest ${ms(node.best)})`);
    const nodeAlloc = allocatedBytes(() => runNodeAnalysis(built, freqs, ws));
    const nodeBytes = nodeAlloc.heap + nodeAlloc.buffers;
    ctx.row(
      'allocated per node analysis (workspace reused): JS heap + buffers',
      `${kib(nodeAlloc.heap)} + ${kib(nodeAlloc.buffers)}`,
      `allocation-free (< ${ALLOCATION_FREE_BYTES} B)`,
      verdict(nodeBytes < ALLOCATION_FREE_BYTES),
    );

    const bare = bareCascade(built, freqs);
    const full = () => analyzeChain(doc, { catalogue, sweep: true });
    // The same analysis for a caller that writes its sweep out before the next one (the
    // report reads the reused workspace instead of a copy); printed, not judged.
    const inPlace = () => analyzeChain(doc, { catalogue, sweep: true, sweepInPlace: true });
    for (let i = 0; i < (ctx.quick ? 3 : 10); i++) {
      bare.run();
      full();
      inPlace();
    }
    const bareMs: number[] = [];
    const fullMs: number[] = [];
    const bareCpu: number[] = [];
    const fullCpu: number[] = [];
    const inPlaceCpu: number[] = [];
    for (let i = 0; i < (ctx.quick ? 15 : 200); i++) {
      bareMs.push(timeMs(() => bareCpu.push(cpuMs(() => bare.run()))));
      fullMs.push(timeMs(() => fullCpu.push(cpuMs(full))));
      inPlaceCpu.push(cpuMs(inPlace));
    }
    const b = median(bareMs);
    const f = median(fullMs);
    ctx.row(`bare typed-array ABCD cascade of the same sections, ${POINTS} points`, ms(b));
    ctx.row(`full analysis (analyzeChain, sweep on), ${POINTS} points`, ms(f));
    ctx.row(
      'full analysis ÷ bare cascade (medians, measured in alternation)',
      `${(f / b).toFixed(1)}×`,
      '≤ 3×',
      verdict(f / b <= 3),
    );
    // Under load the longer of two alternating runs is the likelier to be preempted, which
    // inflates its median more than the shorter one's; the fastest runs show the work itself.
    const fb = Math.min(...bareMs);
    const ff = Math.min(...fullMs);
    ctx.row(
      'full analysis ÷ bare cascade, fastest runs of each (the same alternation)',
      `${ms(ff)} ÷ ${ms(fb)} = ${(ff / fb).toFixed(1)}×`,
    );
    // CPU time leaves out the wait for a core, which on a shared machine is most of the
    // spread of the wall times; its ratio is the steadier sign of the work itself.
    const bc = median(bareCpu);
    const fc = median(fullCpu);
    ctx.row(
      'full analysis ÷ bare cascade by CPU time (medians of the same alternation)',
      `${ms(fc)} ÷ ${ms(bc)} = ${(fc / bc).toFixed(2)}×`,
    );
    const ic = median(inPlaceCpu);
    ctx.row(
      'full analysis with the sweep read in place (sweepInPlace) ÷ bare cascade by CPU time',
      `${ms(ic)} ÷ ${ms(bc)} = ${(ic / bc).toFixed(2)}× (mean ${ms(mean(inPlaceCpu))} against ${ms(mean(fullCpu))} copied)`,
    );
    const everyTrace = () => readEveryTrace(full());
    const readMs: number[] = [];
    for (let i = 0; i < (ctx.quick ? 15 : 60); i++) readMs.push(timeMs(everyTrace));
    ctx.row(`full analysis with every sweep trace read, ${POINTS} points`, ms(median(readMs)));
    const fullAlloc = allocatedBytes(full, ctx.quick ? 5 : 15);
    ctx.row(
      'allocated per full analysis: JS heap + buffers',
      `${kib(fullAlloc.heap)} + ${kib(fullAlloc.buffers)}`,
    );
  },
};

function mean(values: number[]): number {
  return values.reduce((a, b) => a + b, 0) / values.length;
}

/** CPU time of `fn` (user + system, every thread of the process), ms. */
function cpuMs(fn: () => void): number {
  const before = process.cpuUsage();
  fn();
  const d = process.cpuUsage(before);
  return (d.user + d.system) / 1000;
}

/** Reads every trace of the result's sweep (each is computed on first read). */
function readEveryTrace(result: AnalysisResult): number {
  const sweep = result.sweep!;
  let n = sweep.freqsHz.length + sweep.zIn.re.length + sweep.returnLossDb.length;
  for (const node of sweep.nodes) n += node.stepUpDb.length + node.phaseDeg.length;
  return n;
}
