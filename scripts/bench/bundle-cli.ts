/**
 * Bundles the analysis CLI (scripts/analyze.ts) with esbuild into one minified CommonJS file,
 * so it starts with plain `node` and no TypeScript loader: `node dist/analyze.js <chain.json>`.
 * With `snapshot`, it also builds a V8 start-up snapshot of that bundle beside it
 * (`dist/analyze.blob`, for the Node that built it) and a launcher (`dist/analyze`, a shell
 * script): `dist/analyze <chain.json>` runs `node --snapshot-blob dist/analyze.blob -- …`,
 * which starts with the bundle's modules already loaded (zod's schemas built, the stage
 * catalogue made), most of what the bundle costs at start-up.
 * Run directly (`npx tsx scripts/bench/bundle-cli.ts [outfile]`: bundle and snapshot) or
 * import `bundleCli`.
 */
import { build, type Plugin } from 'esbuild';
import { spawnSync } from 'node:child_process';
import { existsSync, writeFileSync } from 'node:fs';
import { basename, delimiter, dirname, join, resolve } from 'node:path';

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

/** The snapshot built beside a bundle: `analyze.js` → `analyze.blob`. */
export function snapshotPath(bundle: string): string {
  return launcherPath(bundle) + '.blob';
}

/** The launcher written beside a bundle: `analyze.js` → `analyze`. */
export function launcherPath(bundle: string): string {
  return bundle.replace(/\.c?js$/, '');
}

/**
 * Demo chains analysed once while the snapshot is built, so the snapshot holds the
 * analysis's functions compiled (V8 keeps their bytecode); not the benchmark's chain.
 */
const WARM_UP = ['shortwave-superhet-single-tank', 'two-metre-coupled-preselector'].map((key) =>
  join(ROOT, 'examples', `${key}.chain.json`),
);

/**
 * V8 options the CLI runs with from its snapshot, which must be built with the same ones (V8
 * refuses a snapshot built with other options). A run is one cold analysis: at V8's default
 * interrupt budget, many functions that run a few hundred times are compiled by the
 * optimiser, which costs more than they would take interpreted before the process ends.
 * Four times that budget leaves them to the interpreter while the long loops of a long sweep
 * are still optimised (measured on the bench chain: about a quarter less CPU for the whole
 * process at 2,001 points, no change at 100,000; the output is byte for byte the same).
 */
export const CLI_V8_OPTIONS = ['--interrupt-budget=270336'];

/**
 * Environment variables that make Node do work at start-up which the CLI never uses.
 * NODE_EXTRA_CA_CERTS: Node 20 reads and parses every certificate in that file before any
 * script runs (a 220 KB bundle took about 45 ms here, more than the CLI's own start from its
 * snapshot), for TLS connections the CLI never opens. The launcher's shell unsets them.
 */
export const CLI_UNUSED_ENV = ['NODE_EXTRA_CA_CERTS'];

/** The launcher's lines that unset {@link CLI_UNUSED_ENV}. */
function dropUnusedEnvironment(): string[] {
  return [
    '# The CLI opens no TLS connection: extra CA certificates would only be parsed at start-up.',
    `unset ${CLI_UNUSED_ENV.join(' ')}`,
  ];
}

/** A string as one shell word. */
const shellWord = (s: string) => `'${s.replace(/'/g, `'\\''`)}'`;

/**
 * Builds the start-up snapshot of `bundle` ({@link snapshotPath}) with this process's Node,
 * the only one that can start from it, and the launcher that starts that Node from it
 * ({@link launcherPath}); returns the launcher's path. Without a script, Node would take an
 * argument such as `--list-types` for one of its own options, hence `--` before them.
 * @throws Error with Node's message when the snapshot cannot be built
 */
export function snapshotCli(bundle: string): string {
  const file = resolve(bundle);
  const blob = snapshotPath(file);
  const args = [...CLI_V8_OPTIONS, '--snapshot-blob', blob, '--build-snapshot', file];
  const p = spawnSync(process.execPath, args, {
    cwd: dirname(file),
    encoding: 'utf8',
    // The warm-up's output is not wanted; its errors are.
    stdio: ['ignore', 'ignore', 'pipe'],
    env: { ...process.env, CW_CLI_WARM_UP: WARM_UP.join(delimiter) },
  });
  if (p.status !== 0) {
    throw new Error(`the CLI's start-up snapshot failed (status ${p.status}): ${p.stderr}`);
  }
  const launcher = launcherPath(file);
  writeFileSync(
    launcher,
    [
      '#!/bin/sh',
      '# The analysis CLI, started from its V8 start-up snapshot (built for this Node and these V8 options only).',
      ...dropUnusedEnvironment(),
      `exec ${[process.execPath, ...CLI_V8_OPTIONS].map(shellWord).join(' ')} --snapshot-blob "\${0%/*}/${basename(blob)}" -- "$@"`,
      '',
    ].join('\n'),
    { mode: 0o755 },
  );
  return launcher;
}

/**
 * Writes the bundle and returns its path (default `dist/analyze.js` in the project); with
 * `snapshot`, builds its start-up snapshot too.
 */
export async function bundleCli(
  outfile = join(ROOT, 'dist', 'analyze.js'),
  { snapshot = false }: { snapshot?: boolean } = {},
): Promise<string> {
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
  if (snapshot) snapshotCli(outfile);
  return outfile;
}

// Run as a script only when this file itself is the entry (not when bundled into another).
if (require.main === module && /bundle-cli\.[cm]?[jt]s$/.test(process.argv[1] ?? '')) {
  bundleCli(process.argv[2], { snapshot: true }).then(
    (file) => process.stdout.write(`${file}\n${snapshotPath(file)}\n${launcherPath(file)}\n`),
    (err: unknown) => {
      console.error(err);
      process.exitCode = 1;
    },
  );
}
