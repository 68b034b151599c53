import type { Response } from 'express';

/** Runs `work` after the answer went out, so its duration tells the caller nothing. */
export function afterAnswer(res: Response, what: string, work: () => Promise<unknown>): void {
  res.once('finish', () => {
    work().catch((err: unknown) =>
      console.error(`[server] ${what} failed after answering:`, (err as Error).message),
    );
  });
}
