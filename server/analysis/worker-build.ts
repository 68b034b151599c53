import type { BuildOptions } from 'esbuild';

/**
 * esbuild options shared by the production bundle (scripts/build-server.ts) and the
 * development bundle of the analysis thread: one CommonJS file for Node 20 with the npm
 * packages left to node_modules.
 */
export const WORKER_BUILD = {
  bundle: true,
  platform: 'node',
  target: 'node20',
  format: 'cjs',
  packages: 'external',
  sourcemap: true,
  logLevel: 'warning',
} satisfies BuildOptions;
