/**
 * Study figures: Monte Carlo trials of the 12-stage bench chain at 201 points with one study
 * worker and with two (each a process of its own, as `npm start` runs them), and a 41-position
 * band study of the shortwave superhet example.
 *
 * The full bench runs all 10,000 trials (one worker: 10,000; two: 5,000 each), from spawning
 * the worker processes to their exit. With --quick it runs 400 and projects: what a worker does
 * once (start, load the code, analyse the nominal chain) counted once, the trials' time scaled
 * (trials are independent, so their time grows linearly with their number).
 */
import { spawn } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { buildSync } from 'esbuild';
import { parseChainDocument } from '../../shared/schema/parse-chain';
import { bandSpecSchema } from '../../shared/schema/studies';
import { runBandStudy } from '../../shared/engine/studies';
import { ms, verdict, type BenchSection } from './rows';

function projectRoot(from: string): string {
  let dir = from;
  while (!existsSync(join(dir, 'package.json')) && dirname(dir) !== dir) dir = dirname(dir);
  return dir;
}
const ROOT = projectRoot(__dirname);

function bundleShard(): string {
  const outfile = join(ROOT, 'dist', 'studies-shard.js');
  buildSync({
    entryPoints: [join(ROOT, 'scripts', 'bench', 'studies-shard.ts')],
    bundle: true,
    platform: 'node',
    target: 'node20',
    format: 'cjs',
    outfile,
    logLevel: 'warning',
  });
  return outfile;
}

/** What one shard process reports (studies-shard.ts). */
interface ShardReport {
  trials: number;
  /** From the process's start to its first trial, ms, and the processor time of that. */
  setupMs: number;
  setupCpuMs: number;
  /** The trials, ms (wall clock) and processor ms. */
  ms: number;
  cpuMs: number;
}

/**
 * Runs a shard; resolves with its report and its 10,000-trial projection: the process's
 * whole time from spawn to exit with its trials' time scaled by `scale`.
 */
function shard(
  file: string,
  points: number,
  from: number,
  to: number,
  scale: number,
): Promise<ShardReport & { projectedMs: number }> {
  const t0 = performance.now();
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [file, String(points), String(from), String(to)]);
    let out = '';
    child.stdout.on('data', (d) => (out += String(d)));
    child.on('error', reject);
    child.on('exit', (code) => {
      if (code !== 0) return reject(new Error(`shard exited with ${code}`));
      const r = JSON.parse(out) as ShardReport;
      resolve({ ...r, projectedMs: performance.now() - t0 + r.ms * (scale - 1) });
    });
  });
}

export const studiesSection: BenchSection = {
  name: 'studies',
  async run(ctx) {
    const file = bundleShard();
    const trials = ctx.quick ? 400 : 10_000;
    const scale = 10_000 / trials;
    const how = scale > 1 ? `projected from ${trials}` : 'all of them';
    const one = await shard(file, 201, 0, trials, scale);
    ctx.row(
      `Monte Carlo, 10,000 trials × 201 points, 12-stage bench chain, one worker (${how}; ${(one.cpuMs / trials).toFixed(2)} ms processor time a trial, ${ms(one.setupMs)} to start and plan)`,
      ms(one.projectedMs),
      '≤ 10 s',
      verdict(one.projectedMs <= 10_000),
    );
    // What one worker's run costs in processor time: its wall time on an idle core.
    const cpu = one.setupCpuMs + one.cpuMs * scale;
    ctx.row(
      '  processor time of the same (start, plan and 10,000 trials; its wall time on an idle core)',
      ms(cpu),
      '—',
    );
    // Two workers, each with half the share (so each would run 5,000 of the 10,000: the same scale).
    const [a, b] = await Promise.all([
      shard(file, 201, 0, trials / 2, scale),
      shard(file, 201, trials / 2, trials, scale),
    ]);
    const two = Math.max(a.projectedMs, b.projectedMs);
    const perTrial = (a.cpuMs + b.cpuMs) / trials;
    ctx.row(
      `  the same with two workers (${(one.projectedMs / two).toFixed(2)}× faster; ${perTrial.toFixed(2)} ms processor time a trial; 2 cores shared with the machine's other work)`,
      ms(two),
      '—',
    );
    const doc = parseChainDocument(
      JSON.parse(
        readFileSync(join(ROOT, 'examples', 'shortwave-superhet-single-tank.chain.json'), 'utf8'),
      ),
    );
    const spec = bandSpecSchema.parse({
      kind: 'band',
      gang: [{ stageId: 'preselector', key: 'c', min: 150e-12, max: 330e-12 }],
      positions: 41,
    });
    const runs = ctx.quick ? 1 : 3;
    const times: number[] = [];
    for (let i = 0; i < runs; i++) {
      const t = performance.now();
      runBandStudy({ doc }, spec);
      times.push(performance.now() - t);
    }
    const band = times.sort((a, b) => a - b)[Math.floor(times.length / 2)];
    ctx.row(
      'Band study, 41 dial positions, shortwave superhet example',
      ms(band),
      '≤ 1 s',
      verdict(band <= 1000),
    );
  },
};
