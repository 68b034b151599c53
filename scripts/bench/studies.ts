/**
 * Study figures: Monte Carlo trials of the 12-stage bench chain at 201 points with one study
 * worker and with two (each a process of its own, as `npm start` runs them), and a 41-position
 * band study of the shortwave superhet example.
 *
 * A full 10,000-trial run takes minutes on a shared machine, so the bench times a share of it
 * (1,000 trials; 200 with --quick) and states the 10,000-trial time it projects (trials are
 * independent, so time grows linearly with them).
 */
import { spawn } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { buildSync } from 'esbuild';
import { chainDocumentSchema } from '../../shared/schema/chain';
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

function shard(file: string, points: number, from: number, to: number): Promise<number> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [file, String(points), String(from), String(to)]);
    let out = '';
    child.stdout.on('data', (d) => (out += String(d)));
    child.on('error', reject);
    child.on('exit', (code) =>
      code === 0 ? resolve(JSON.parse(out).ms) : reject(new Error(`shard exited with ${code}`)),
    );
  });
}

export const studiesSection: BenchSection = {
  name: 'studies',
  async run(ctx) {
    const file = bundleShard();
    const trials = ctx.quick ? 200 : 1000;
    const scale = 10_000 / trials;
    const t1 = performance.now();
    await shard(file, 201, 0, trials);
    const one = (performance.now() - t1) * scale;
    ctx.row(
      `Monte Carlo, 10,000 trials × 201 points, 12-stage bench chain, one worker (projected from ${trials})`,
      ms(one),
      '≤ 10 s',
      verdict(one <= 10_000),
    );
    const t2 = performance.now();
    await Promise.all([shard(file, 201, 0, trials / 2), shard(file, 201, trials / 2, trials)]);
    const two = (performance.now() - t2) * scale;
    ctx.row(
      `  the same with two workers (${(one / two).toFixed(2)}× faster; 2 cores shared with the machine's other work)`,
      ms(two),
      '—',
    );
    const doc = chainDocumentSchema.parse(
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
