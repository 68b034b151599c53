import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { REPO_ROOT } from './config';

/**
 * Fills unset variables from `.data/dev.env`, which `npm start` writes (DATABASE_URL of
 * the local cluster), so `npm run db:migrate` or `npm run serve` work in a second terminal.
 */
export function loadDevEnv(env: NodeJS.ProcessEnv = process.env): void {
  const file = path.join(REPO_ROOT, '.data', 'dev.env');
  if (!existsSync(file)) return;
  for (const line of readFileSync(file, 'utf8').split('\n')) {
    const match = /^([A-Z_][A-Z0-9_]*)=(.*)$/.exec(line.trim());
    if (match && env[match[1]] === undefined) env[match[1]] = match[2];
  }
}
