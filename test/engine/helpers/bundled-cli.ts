/**
 * The analysis CLI as the bench times it, for a test file that runs it as a separate
 * process: bundled with esbuild into a temporary folder before the file's tests (removed
 * after them), and run with the arguments given.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { bundleCli } from '../../../scripts/bench/bundle-cli';

export interface CliRun {
  code: number | null;
  out: string;
  err: string;
}

export interface BundledCli {
  /** The temporary folder, for a test's own files (set before the file's tests). */
  readonly dir: string;
  /** The bundle (set before the file's tests). */
  readonly bundle: string;
  /** Runs the bundle with `args`, waiting at most `timeoutMs`. */
  run(...args: string[]): CliRun;
}

/** Bundles the CLI for the calling test file; `prefix` names its temporary folder. */
export function bundledCli(prefix: string, timeoutMs = 30_000): BundledCli {
  let dir = '';
  let bundle = '';
  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), prefix));
    bundle = await bundleCli(join(dir, 'analyze.js'));
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  return {
    get dir() {
      return dir;
    },
    get bundle() {
      return bundle;
    },
    run(...args: string[]): CliRun {
      // A long sweep's table runs to megabytes: room for it (Node's default is 1 MiB, past
      // which the process is killed).
      const p = spawnSync(process.execPath, [bundle, ...args], { encoding: 'utf8', timeout: timeoutMs, maxBuffer: 256 << 20 }); // prettier-ignore
      return { code: p.status, out: p.stdout, err: p.stderr };
    },
  };
}
