/** Study worker processes for API tests, on a test file's own schema. */
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { REPO_ROOT } from '../../../server/config';
import { testDatabaseUrl } from './test-db';

export interface WorkerProcess {
  child: ChildProcess;
  /** What it printed, for a failing test's message. */
  output: () => string;
  /** Sends a signal and waits for the process to end. */
  stop: (signal?: NodeJS.Signals) => Promise<void>;
}

/** Starts `node --import tsx server/worker.ts` against `schema` with extra environment. */
export function startWorker(schema: string, env: Record<string, string> = {}): WorkerProcess {
  const child = spawn(process.execPath, ['--import', 'tsx', path.join('server', 'worker.ts')], {
    cwd: REPO_ROOT,
    env: { ...process.env, DATABASE_URL: testDatabaseUrl(), CW_DB_SCHEMA: schema, ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  child.stdout!.on('data', (d) => (out += String(d)));
  child.stderr!.on('data', (d) => (out += String(d)));
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  return {
    child,
    output: () => out,
    stop: async (signal = 'SIGTERM') => {
      if (child.exitCode === null && child.signalCode === null) child.kill(signal);
      await exited;
    },
  };
}
