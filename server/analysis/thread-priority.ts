import { readlinkSync } from 'node:fs';
import { setPriority } from 'node:os';

/**
 * Lowers the CPU priority of the calling thread (an analysis thread) to `nice`, so that on
 * a busy machine the event loop (health checks, sign-ins, small answers) is scheduled
 * before a long analysis instead of waiting for its time slice. On Linux every thread has
 * a nice value of its own, set through its thread id; elsewhere, or when the system
 * refuses, the thread keeps the process's priority.
 */
export function lowerThreadPriority(nice: number): boolean {
  try {
    const tid = Number(readlinkSync('/proc/thread-self').split('/').pop());
    if (!Number.isInteger(tid) || tid <= 0 || tid === process.pid) return false;
    setPriority(tid, nice);
    return true;
  } catch {
    return false;
  }
}
