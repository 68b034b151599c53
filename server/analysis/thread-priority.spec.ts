import { readFileSync } from 'node:fs';
import path from 'node:path';
import { Worker } from 'node:worker_threads';
import { buildSync } from 'esbuild';
import { lowerThreadPriority } from './thread-priority';

/** The nice value of the calling thread (field 19 of its stat line). */
function niceOfMainThread(): number {
  const stat = readFileSync('/proc/thread-self/stat', 'utf8');
  return Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[16]);
}

describe('an analysis thread at a lower priority', () => {
  it('should lower the nice value of its own thread only, never the whole process', async () => {
    const before = niceOfMainThread();
    // The main thread's id is the process id: lowering it would lower every thread.
    expect(lowerThreadPriority(before + 5)).toBe(false);
    expect(niceOfMainThread()).toBe(before);

    const bundle = buildSync({
      entryPoints: [path.join(__dirname, 'thread-priority.ts')],
      bundle: true,
      platform: 'node',
      format: 'cjs',
      write: false,
    }).outputFiles[0].text;
    const code = `
      const exports = {}; const module = { exports };
      ${bundle}
      const lowered = module.exports.lowerThreadPriority(${before + 5});
      const stat = require('node:fs').readFileSync('/proc/thread-self/stat', 'utf8');
      const nice = Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[16]);
      require('node:worker_threads').parentPort.postMessage({ lowered, nice });
    `;
    const worker = new Worker(code, { eval: true });
    const answer = await new Promise<{ lowered: boolean; nice: number }>((resolve, reject) => {
      worker.once('message', resolve);
      worker.once('error', reject);
    });
    await worker.terminate();
    expect(answer).toEqual({ lowered: true, nice: before + 5 });
    expect(niceOfMainThread()).toBe(before);
  });
});
