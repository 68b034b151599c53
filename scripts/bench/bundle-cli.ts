/**
 * Bundles the analysis CLI (scripts/analyze.ts) with esbuild into one CommonJS file, so it
 * starts with plain `node` and no TypeScript loader: `node dist/analyze.js <chain.json>`.
 * Run directly (`npx tsx scripts/bench/bundle-cli.ts [outfile]`) or import `bundleCli`.
 */
import { buildSync } from 'esbuild';
import { join } from 'node:path';

const ROOT = join(__dirname, '..', '..');

/** Writes the bundle and returns its path (default `dist/analyze.js` in the project). */
export function bundleCli(outfile = join(ROOT, 'dist', 'analyze.js')): string {
  buildSync({
    entryPoints: [join(ROOT, 'scripts', 'analyze.ts')],
    bundle: true,
    platform: 'node',
    target: 'node20',
    format: 'cjs',
    outfile,
    logLevel: 'warning',
  });
  return outfile;
}

if (require.main === module) {
  process.stdout.write(`${bundleCli(process.argv[2])}\n`);
}
