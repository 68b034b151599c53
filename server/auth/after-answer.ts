import type { Response } from 'express';

/** Work started after an answer and not yet finished, so shutting down can wait for it. */
const pending = new Set<Promise<void>>();

/** Runs `work` after the answer went out, so its duration tells the caller nothing. */
export function afterAnswer(res: Response, what: string, work: () => Promise<unknown>): void {
  res.once('finish', () => {
    const run = work()
      .then(() => undefined)
      .catch((err: unknown) =>
        console.error(`[server] ${what} failed after answering:`, (err as Error).message),
      )
      .finally(() => pending.delete(run));
    pending.add(run);
  });
}

/**
 * Waits (at most `timeoutMs`) for the work started after answers, before the database and
 * the mailer it uses are closed: a mail queued just before shutdown is still written.
 */
export async function settleAfterAnswerWork(timeoutMs = 5000): Promise<void> {
  if (pending.size === 0) return;
  let timer: NodeJS.Timeout | undefined;
  await Promise.race([
    Promise.allSettled([...pending]),
    new Promise((resolve) => {
      timer = setTimeout(resolve, timeoutMs);
      timer.unref();
    }),
  ]);
  clearTimeout(timer);
}
