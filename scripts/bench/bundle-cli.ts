/**
 * Bundles the analysis CLI (scripts/analyze.ts) with esbuild into one minified CommonJS file,
 * so it starts with plain `node` and no TypeScript loader: `node dist/analyze.js <chain.json>`.
 * Run directly (`npx tsx scripts/bench/bundle-cli.ts [outfile]`) or import `bundleCli`.
 */
import { buildSync } from 'esbuild';
import { existsSync } from 'node:fs';
import { dirname, join } from 'node:path';

/** The project root: the nearest folder above this file with a package.json (this file may run from source or from a bundle in dist/). */
function projectRoot(from: string): string {
  let dir = from;
  while (!existsSync(join(dir, 'package.json')) && dirname(dir) !== dir) dir = dirname(dir);
  return dir;
}

const ROOT = projectRoot(__dirname);

/** Writes the bundle and returns its path (default `dist/analyze.js` in the project). */
export function bundleCli(outfile = join(ROOT, 'dist', 'analyze.js')): string {
  buildSync({
    entryPoints: [join(ROOT, 'scripts', 'analyze.ts')],
    bundle: true,
    platform: 'node',
    target: 'node20',
    format: 'cjs',
    outfile,
    // A smaller file parses faster, and the CLI's start-up is part of every run.
    minify: true,
    logLevel: 'warning',
  });
  return outfile;
}

// Run as a script only when this file itself is the entry (not when bundled into another).
if (require.main === module && /bundle-cli\.[cm]?[jt]s$/.test(process.argv[1] ?? '')) {
  process.stdout.write(`${bundleCli(process.argv[2])}\n`);
}
