/**
 * The worker's side of one study: claim it, run it in a thread, write progress, heartbeat and
 * checkpoints to the study row, act on a cancel or the time budget by ending the thread, and
 * record the result or the reason it failed.
 */
import path from 'node:path';
import { Worker } from 'node:worker_threads';
import type pg from 'pg';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { ChainDocument } from '../../shared/schema/chain';
import { parseChainDocument } from '../../shared/schema/parse-chain';
import type { StudySpec } from '../../shared/schema/studies';
import { loadDataFiles } from '../files/data-files';
import type { StudyLimits } from './limits';
import type { ThreadInput, ThreadMessage } from './study-thread';

const TICK_MS = 250;

/**
 * Starts the study thread: the bundled study-thread.js beside a bundled worker, or the .ts
 * source through tsx's require hook (a worker thread does not inherit `--import tsx`).
 */
function startThread(workerData: ThreadInput): Worker {
  if (!__filename.endsWith('.ts'))
    return new Worker(path.join(__dirname, 'study-thread.js'), { workerData });
  const source = JSON.stringify(path.join(__dirname, 'study-thread.ts'));
  return new Worker(`require('tsx/cjs/api').register(); require(${source});`, {
    eval: true,
    workerData,
  });
}

export interface RunnerContext {
  pool: pg.Pool;
  em: EntityManager;
  limits: StudyLimits;
  log: (msg: string) => void;
}

interface Claimed {
  spec: StudySpec;
  document: ChainDocument;
  checkpoint: unknown;
  attempts: number;
  workspace_id: string;
}

/** Live runs in this process, so a stopping worker can hand them back. */
const live = new Map<string, { stop: (reason: 'handback') => Promise<void> }>();

async function claim(pool: pg.Pool, id: string): Promise<Claimed | null> {
  // A study cancelled while queued is already 'cancelled'; only a queued one is taken.
  const { rows } = await pool.query<Claimed>(
    `update study s set status = 'running', attempts = s.attempts + 1,
       started_at = coalesce(s.started_at, now()), heartbeat_at = now(), error = null
     from chain c
     where s.id = $1 and s.status = 'queued' and not s.cancel_requested and c.id = s.chain_id
     returning s.spec, s.document, s.checkpoint, s.attempts, c.workspace_id`,
    [id],
  );
  return rows[0] ?? null;
}

async function finish(
  pool: pg.Pool,
  id: string,
  status: 'done' | 'failed' | 'cancelled' | 'queued',
  fields: { result?: unknown; error?: string; progress?: unknown },
): Promise<void> {
  await pool.query(
    `update study set status = $2::varchar, result = coalesce($3::jsonb, result), error = $4,
       progress = coalesce($5::jsonb, progress),
       finished_at = case when $2::varchar = 'queued' then null else now() end
     where id = $1 and status = 'running'`,
    [
      id,
      status,
      fields.result === undefined ? null : JSON.stringify(fields.result),
      fields.error ?? null,
      fields.progress === undefined ? null : JSON.stringify(fields.progress),
    ],
  );
}

/**
 * Runs study `id` to its end in this process. Returns 'handback' when the worker is stopping
 * and the study went back to the queue.
 */
export async function runStudy(ctx: RunnerContext, id: string): Promise<string> {
  const { pool, limits } = ctx;
  const claimed = await claim(pool, id);
  if (!claimed) return 'skipped';
  ctx.log(`study ${id} (${claimed.spec.kind}) started, run ${claimed.attempts}`);
  let dataFiles: ThreadInput['dataFiles'];
  let doc: ChainDocument;
  try {
    // Stored when the study was asked for; parsed again so the engine gets today's schema.
    doc = parseChainDocument(claimed.document, "the study's chain");
    dataFiles = (await loadDataFiles(ctx.em.fork(), doc, claimed.workspace_id)) ?? undefined;
  } catch (err) {
    await finish(pool, id, 'failed', { error: err instanceof Error ? err.message : String(err) });
    return 'failed';
  }
  const input: ThreadInput = {
    spec: claimed.spec,
    doc,
    dataFiles,
    checkpoint: claimed.checkpoint,
  };
  const thread = startThread(input);
  const started = Date.now();
  let progress: unknown = null;
  let progressKey = '';
  let checkpoint: unknown = undefined;
  let outcome: ThreadMessage | null = null;
  let ended = false;
  let stopReason: 'handback' | null = null;

  return await new Promise<string>((resolve) => {
    let ticking = false;
    const end = async (
      status: 'done' | 'failed' | 'cancelled' | 'queued',
      fields: Parameters<typeof finish>[3],
    ) => {
      if (ended) return;
      ended = true;
      clearInterval(timer);
      live.delete(id);
      await thread.terminate();
      if (checkpoint !== undefined) {
        await pool.query('update study set checkpoint = $2 where id = $1', [
          id,
          JSON.stringify(checkpoint),
        ]);
      }
      await finish(pool, id, status, fields);
      ctx.log(`study ${id} ${status}${fields.error ? `: ${fields.error}` : ''}`);
      resolve(status);
    };
    thread.on('message', (m: ThreadMessage) => {
      if (m.type === 'progress')
        progress = { fraction: m.fraction, done: m.done, total: m.total, interim: m.interim };
      else if (m.type === 'checkpoint') checkpoint = m.checkpoint;
      else outcome = m;
    });
    thread.on(
      'error',
      (err) => void end('failed', { error: `the study's thread failed: ${err.message}` }),
    );
    thread.on('exit', () => {
      if (ended) return;
      const o = outcome as ThreadMessage | null;
      if (o?.type === 'done') {
        const p = progress as { total?: number } | null;
        void end('done', {
          result: o.result,
          progress: { fraction: 1, done: p?.total ?? 1, total: p?.total ?? 1 },
        });
      } else if (o?.type === 'failed') void end('failed', { error: o.message });
      else
        void end('failed', {
          error: 'the study\u2019s thread ended without a result (out of memory?)',
        });
    });
    live.set(id, {
      stop: async (reason) => {
        stopReason = reason;
        await end('queued', {});
      },
    });
    const timer = setInterval(() => {
      if (ticking || ended) return;
      ticking = true;
      void (async () => {
        try {
          const key = JSON.stringify(progress);
          const { rows } = await pool.query<{ cancel_requested: boolean }>(
            `update study set heartbeat_at = now(), progress = coalesce($2::jsonb, progress),
               checkpoint = coalesce($3::jsonb, checkpoint)
             where id = $1 returning cancel_requested`,
            [
              id,
              key !== progressKey ? key : null,
              checkpoint !== undefined ? JSON.stringify(checkpoint) : null,
            ],
          );
          progressKey = key;
          checkpoint = undefined;
          if (rows[0]?.cancel_requested) await end('cancelled', { error: 'cancelled by a user' });
          else if (Date.now() - started > limits.budgetSeconds * 1000) {
            await end('failed', {
              error: `the study ran past its time budget of ${limits.budgetSeconds} s: ask for fewer trials, positions, iterations or sweep points`,
            });
          }
        } catch (err) {
          ctx.log(`study ${id}: ${err instanceof Error ? err.message : String(err)}`);
        } finally {
          ticking = false;
        }
      })();
    }, TICK_MS);
  }).then((status) => (stopReason === 'handback' ? 'handback' : status));
}

/** Hands every study running in this process back to the queue (the worker is stopping). */
export async function handBackAll(): Promise<string[]> {
  const ids = [...live.keys()];
  await Promise.all([...live.values()].map((r) => r.stop('handback')));
  return ids;
}
