/**
 * One study worker's share of the benchmark's Monte Carlo run, as its own process:
 *   node dist/studies-shard.js <points> <from> <to>
 * Prints (JSON) the trials done, the milliseconds from the process's start to the first trial
 * (loading the code and planning: once per worker, whatever the trial count) and the processor
 * time that took, and the milliseconds and processor time the trials took.
 */
import { parseChainDocument } from '../../shared/schema/parse-chain';
import { monteCarloSpecSchema } from '../../shared/schema/studies';
import { planMonteCarlo, runTrials } from '../../shared/engine/studies';
import { benchChain } from './bench-chain';

const [points, from, to] = process.argv.slice(2).map(Number);
const doc = parseChainDocument(benchChain(points));
// Every reactive value of the bench chain's tuned parts at ±5 %.
for (const s of doc.stages) {
  const keys = Object.keys(s.values).filter((k) => ['l', 'c', 'l1', 'l2', 'cc'].includes(k));
  if (keys.length) s.tolerances = Object.fromEntries(keys.map((k) => [k, 5]));
}
const spec = monteCarloSpecSchema.parse({ kind: 'monte-carlo', trials: Math.max(2, to), seed: 1 });
const inputs = { doc };
const plan = planMonteCarlo(inputs, spec);
// performance.now() counts from the process's start.
const t0 = performance.now();
const c0 = process.cpuUsage(); // processor time since the process started
runTrials(inputs, plan, from, to);
const cpu = process.cpuUsage(c0);
const out = {
  trials: to - from,
  setupMs: t0,
  setupCpuMs: (c0.user + c0.system) / 1000,
  ms: performance.now() - t0,
  cpuMs: (cpu.user + cpu.system) / 1000,
};
process.stdout.write(`${JSON.stringify(out)}\n`);
