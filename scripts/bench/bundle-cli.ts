/**
 * Bundles the analysis CLI (scripts/analyze.ts) with esbuild into one minified CommonJS file,
 * so it starts with plain `node` and no TypeScript loader: `node dist/analyze.js <chain.json>`.
 * Run directly (`npx tsx scripts/bench/bundle-cli.ts [outfile]`) or import `bundleCli`.
 */
import { build, type Plugin } from 'esbuild';
import { existsSync } from 'node:fs';
import { dirname, join } from 'node:path';

/** The project root: the nearest folder above this file with a package.json (this file may run from source or from a bundle in dist/). */
function projectRoot(from: string): string {
  let dir = from;
  while (!existsSync(join(dir, 'package.json')) && dirname(dir) !== dir) dir = dirname(dir);
  return dir;
}

const ROOT = projectRoot(__dirname);

/**
 * zod's messages come in some forty languages, all reachable from its namespace object, so a
 * bundler keeps every one; the CLI speaks English only (zod's default), and the others were
 * two fifths of the bundle it parses on every start. (A plugin: esbuild's asynchronous API.)
 */
const englishOnlyZod: Plugin = {
  name: 'english-only-zod',
  setup(b) {
    b.onLoad({ filter: /[\\/]zod[\\/]v4[\\/]locales[\\/]index\.c?js$/ }, (args) => ({
      contents: `export { default as en } from "./en${args.path.endsWith('.cjs') ? '.cjs' : '.js'}";`,
      resolveDir: dirname(args.path),
      loader: 'js',
    }));
  },
};

/** Writes the bundle and returns its path (default `dist/analyze.js` in the project). */
export async function bundleCli(outfile = join(ROOT, 'dist', 'analyze.js')): Promise<string> {
  await build({
    entryPoints: [join(ROOT, 'scripts', 'analyze.ts')],
    bundle: true,
    platform: 'node',
    target: 'node20',
    format: 'cjs',
    outfile,
    // A smaller file parses faster, and the CLI's start-up is part of every run.
    minify: true,
    plugins: [englishOnlyZod],
    logLevel: 'warning',
  });
  return outfile;
}

// Run as a script only when this file itself is the entry (not when bundled into another).
if (require.main === module && /bundle-cli\.[cm]?[jt]s$/.test(process.argv[1] ?? '')) {
  bundleCli(process.argv[2]).then(
    (file) => process.stdout.write(`${file}\n`),
    (err: unknown) => {
      console.error(err);
      process.exitCode = 1;
    },
  );
}
