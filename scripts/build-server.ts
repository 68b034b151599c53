/**
 * Bundles the server for a production start (`npm start` runs this, then
 * `node dist/server/main.js`): one CommonJS file per entry, npm packages left in
 * node_modules, source maps beside them.
 *   dist/server/main.js             the HTTP server (server/main.ts)
 *   dist/server/analysis-worker.js  the analysis thread the server's pool runs
 *   dist/server/worker.js           the study worker (server/worker.ts)
 *   dist/server/study-thread.js     the thread the study worker runs each study in
 * Usage: node --import tsx scripts/build-server.ts
 */
import { existsSync } from 'node:fs';
import path from 'node:path';
import { buildSync } from 'esbuild';
import { serverBundleOptions } from '../server/analysis/worker-build';

const root = path.resolve(__dirname, '..');
const out = path.join(root, 'dist', 'server');
const entries: [string, string][] = [
  ['server/main.ts', 'main.js'],
  ['server/analysis/analysis-worker.ts', 'analysis-worker.js'],
  ['server/worker.ts', 'worker.js'],
  ['server/studies/study-thread.ts', 'study-thread.js'],
];

const started = Date.now();
const options = serverBundleOptions(root);
for (const [source, bundle] of entries) {
  const entry = path.join(root, source);
  if (!existsSync(entry)) continue;
  buildSync({ ...options, entryPoints: [entry], outfile: path.join(out, bundle) });
}
console.log(`[build] server bundled into dist/server in ${Date.now() - started} ms`);
