/** A real server process (server/main.ts) for API tests, on a test file's own schema. */
import { spawn } from 'node:child_process';
import net from 'node:net';
import path from 'node:path';
import { REPO_ROOT } from '../../../server/config';
import { testDatabaseUrl } from './test-db';

export interface ServerProcess {
  /** Where it listens, e.g. http://127.0.0.1:40123. */
  url: string;
  port: number;
  /** What it printed, for a failing test's message. */
  output: () => string;
  /** Stops it (SIGTERM, its own orderly stop) and waits for the exit. */
  stop: () => Promise<void>;
}

/** A port nobody listens on now (the system picks it; closed again at once). */
function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = net.createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const { port } = probe.address() as net.AddressInfo;
      probe.close(() => resolve(port));
    });
  });
}

/**
 * Starts `node --import tsx server/main.ts` against `schema` (tables made by the test's own
 * context) and resolves once it listens. No mail catcher: mail goes to a JSON transport.
 */
export async function startServerProcess(
  schema: string,
  env: Record<string, string> = {},
): Promise<ServerProcess> {
  const port = await freePort();
  const childEnv: NodeJS.ProcessEnv = {
    ...process.env,
    DATABASE_URL: testDatabaseUrl(),
    CW_DB_SCHEMA: schema,
    HOST: '127.0.0.1',
    PORT: String(port),
    CW_ANALYSIS_THREADS: '1',
    ...env,
  };
  // The developer's own mail settings must not start a second catcher or reach a relay.
  delete childEnv.CW_SMTP_PORT;
  delete childEnv.SMTP_URL;
  delete childEnv.CW_SMTP_HOST;
  const child = spawn(process.execPath, ['--import', 'tsx', path.join('server', 'main.ts')], {
    cwd: REPO_ROOT,
    env: childEnv,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(
      () => reject(new Error(`the server process did not start within 60 s:\n${out}`)),
      60_000,
    );
    const onData = (d: Buffer) => {
      out += String(d);
      if (out.includes('Chainwright is listening')) {
        clearTimeout(timer);
        resolve();
      }
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', (d: Buffer) => (out += String(d)));
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`the server process ended (${code}) before listening:\n${out}`));
    });
  });
  return {
    url: `http://127.0.0.1:${port}`,
    port,
    output: () => out,
    stop: async () => {
      if (child.exitCode === null && child.signalCode === null) child.kill('SIGTERM');
      await exited;
    },
  };
}
