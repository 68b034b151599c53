/**
 * Runs a whole process for the benchmark: wall time, CPU time and peak resident memory (GNU
 * time's user + system seconds and maximum RSS), exit status, with stdout written to a file
 * so both sides of a comparison pay for writing their output. On a loaded machine the CPU
 * time says more than the wall time, which is mostly the wait for a core.
 */
import { spawnSync } from 'node:child_process';
import { closeSync, existsSync, openSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { timeMs } from './measure';

const GNU_TIME = '/usr/bin/time';

export interface ProcessRun {
  wallMs: number;
  /** Peak resident set size, bytes (NaN when GNU time is not installed). */
  peakBytes: number;
  /** User + system CPU time of the process and its threads, ms (NaN without GNU time). */
  cpuMs: number;
  status: number | null;
  stderr: string;
}

/** Runs `command args` in `cwd` with stdout to `stdoutFile` (in `env`, default this process's). */
export function runProcess(
  command: string,
  args: string[],
  cwd: string,
  stdoutFile: string,
  env: NodeJS.ProcessEnv = process.env,
): ProcessRun {
  const rssFile = join(cwd, 'peak-rss.txt');
  const withTime = existsSync(GNU_TIME);
  const out = openSync(stdoutFile, 'w');
  let p: ReturnType<typeof spawnSync> | undefined;
  try {
    const wallMs = timeMs(() => {
      p = withTime
        ? spawnSync(GNU_TIME, ['-f', '%M %U %S', '-o', rssFile, command, ...args], {
            cwd,
            env,
            stdio: ['ignore', out, 'pipe'],
            maxBuffer: 1 << 26,
          })
        : spawnSync(command, args, {
            cwd,
            env,
            stdio: ['ignore', out, 'pipe'],
            maxBuffer: 1 << 26,
          });
    });
    if (!p || p.error) {
      throw new Error(`${command} could not run: ${p?.error?.message ?? 'no process'}`);
    }
    const [peakKb, userS, systemS] = withTime
      ? readFileSync(rssFile, 'utf8').trim().split('\n').pop()!.split(' ').map(Number)
      : [NaN, NaN, NaN];
    return {
      wallMs,
      peakBytes: peakKb * 1024,
      cpuMs: (userS + systemS) * 1000,
      status: p.status,
      stderr: String(p.stderr ?? ''),
    };
  } finally {
    closeSync(out);
  }
}

/** Number of lines in a (possibly large) text file. */
export function lineCount(file: string): number {
  const text = readFileSync(file);
  let n = 0;
  for (let i = 0; i < text.length; i++) if (text[i] === 10) n++;
  return n;
}
