import { readFileSync } from 'node:fs';
import path from 'node:path';
import type { BuildOptions } from 'esbuild';

/**
 * npm packages bundled rather than left to node_modules. mathjs's CommonJS entry builds its
 * whole default instance as it loads (every function, its documentation strings): 28 MB of
 * the server's heap and 0.6 s of its start for the few unit and arithmetic functions
 * shared/units/parse.ts asks for. Bundled from its ES modules, only those are kept (as the
 * client's build keeps them), and the event loop's full collections have that much less to
 * mark.
 */
const BUNDLED_PACKAGES = new Set(['mathjs']);

/**
 * esbuild options shared by the production bundle (scripts/build-server.ts) and the
 * development bundle of the analysis thread: one CommonJS file for Node 20 with the npm
 * packages left to node_modules, except `BUNDLED_PACKAGES` (and what they import).
 * `root`: the repository, whose package.json names the packages.
 */
export function serverBundleOptions(root: string) {
  const manifest = JSON.parse(readFileSync(path.join(root, 'package.json'), 'utf8')) as {
    dependencies?: Record<string, string>;
    devDependencies?: Record<string, string>;
  };
  const names = Object.keys({ ...manifest.dependencies, ...manifest.devDependencies });
  const external = names
    .filter((name) => !BUNDLED_PACKAGES.has(name))
    .flatMap((name) => [name, `${name}/*`]);
  return {
    bundle: true,
    platform: 'node',
    target: 'node20',
    format: 'cjs',
    external,
    // Where a package offers both, its ES modules: what lets the bundle keep only what is used.
    mainFields: ['module', 'main'],
    sourcemap: true,
    logLevel: 'warning',
  } satisfies BuildOptions;
}
