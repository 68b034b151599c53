/** Timing and allocation helpers for the benchmark (figures only; no test asserts them). */
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';

/** Median of a list of numbers. */
export function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** Wall time of `fn` in milliseconds. */
export function timeMs(fn: () => void): number {
  const t = process.hrtime.bigint();
  fn();
  return Number(process.hrtime.bigint() - t) / 1e6;
}

/** Median time of `runs` calls after `warmup` calls, ms. */
export function medianMs(fn: () => void, runs: number, warmup = Math.min(runs, 20)): number {
  return timings(fn, runs, warmup).median;
}

/** Median and fastest of `runs` calls after `warmup` calls, ms (the fastest shows the
 * machine's capability when other work shares it). */
export function timings(
  fn: () => void,
  runs: number,
  warmup = Math.min(runs, 20),
): { median: number; best: number } {
  for (let i = 0; i < warmup; i++) fn();
  const all = Array.from({ length: runs }, () => timeMs(fn));
  return { median: median(all), best: Math.min(...all) };
}

let gcFn: (() => void) | undefined;
/** A full garbage collection (the V8 flag is set on first use). */
function gc(): void {
  if (!gcFn) {
    setFlagsFromString('--expose-gc');
    gcFn = runInNewContext('gc') as () => void;
  }
  gcFn();
}

/**
 * Bytes one call of `fn` allocates: JS heap and typed-array buffers, each the median over
 * `runs` calls with a full collection before each (so nothing earlier is counted).
 */
export function allocatedBytes(fn: () => void, runs = 15): { heap: number; buffers: number } {
  fn();
  const heap: number[] = [];
  const buffers: number[] = [];
  for (let i = 0; i < runs; i++) {
    gc();
    const before = process.memoryUsage();
    fn();
    const after = process.memoryUsage();
    heap.push(Math.max(0, after.heapUsed - before.heapUsed));
    buffers.push(Math.max(0, after.arrayBuffers - before.arrayBuffers));
  }
  return { heap: median(heap), buffers: median(buffers) };
}
