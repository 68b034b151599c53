/**
 * Compressed analysis answers kept in memory for a while, so asking again for an analysis
 * already made (a tab opened again, an undo back to a state just analysed, a double click)
 * costs a hash instead of a thread's work; identical requests in flight together share one
 * analysis. An answer is a pure function of the task the thread is given (the document, the
 * data files it reads, every option, the encoding), so the key is a hash of that whole
 * task: a changed document or option is a different key, and nothing needs invalidating.
 * Keys are per user, so no one can tell from the answer time what someone else analysed.
 * A request with `Cache-Control: no-cache` (or no-store) is always computed afresh: the
 * bench measures the API that way as well as with the cache.
 */
import { createHash } from 'node:crypto';
import type { Request } from 'express';
import { LRUCache } from 'lru-cache';
import type { AnalysisOutcome, AnalysisTask } from './analysis-task';

type Answer = Extract<AnalysisOutcome, { kind: 'answer' }>;

/** Bytes of answers kept at most. */
const MAX_BYTES = 32 * 1024 * 1024;
/** Larger answers (the biggest sweeps) are not kept: a few would push out all the others. */
const MAX_ANSWER_BYTES = 1024 * 1024;

const answers = new LRUCache<string, Answer>({
  maxSize: MAX_BYTES,
  sizeCalculation: (a) => a.body.byteLength + 200,
  ttl: 10 * 60_000,
});
const running = new Map<string, Promise<AnalysisOutcome>>();

/** How the answer was found, sent in the `x-analysis-answer` header. */
export type AnswerSource = 'cached' | 'computed';

/** Whether the request asks for a fresh analysis (`Cache-Control: no-cache` or no-store). */
export function wantsFresh(req: Request): boolean {
  return /\bno-(cache|store)\b/i.test(String(req.headers['cache-control'] ?? ''));
}

function keyOf(userId: string, task: AnalysisTask): string {
  return createHash('sha256').update(userId).update('\0').update(JSON.stringify(task)).digest('base64'); // prettier-ignore
}

/**
 * The outcome of `task` for `userId`: a kept answer, the one already being computed for the
 * same key, or `compute()`'s (kept when it is an answer of moderate size).
 */
export async function cachedOutcome(
  userId: string,
  task: AnalysisTask,
  compute: () => Promise<AnalysisOutcome>,
): Promise<{ outcome: AnalysisOutcome; source: AnswerSource }> {
  const key = keyOf(userId, task);
  const kept = answers.get(key);
  if (kept) return { outcome: kept, source: 'cached' };
  const pending = running.get(key);
  if (pending) return { outcome: await pending, source: 'cached' };
  const work = compute();
  running.set(key, work);
  try {
    const outcome = await work;
    if (outcome.kind === 'answer' && outcome.body.byteLength <= MAX_ANSWER_BYTES) {
      answers.set(key, outcome);
    }
    return { outcome, source: 'computed' };
  } finally {
    running.delete(key);
  }
}

/** Forgets every kept answer (tests; a change of limits). */
export function clearAnswerCache(): void {
  answers.clear();
}
