/**
 * A study worker: takes study jobs (Monte Carlo, band, optimiser) from the pg-boss queue on
 * the product's PostgreSQL and runs them one at a time, each in a thread of its own.
 * `npm start` runs CW_WORKERS of these beside the web server (default 1). More workers on
 * more machines against the same database share the work with no other change:
 *
 *   DATABASE_URL=postgresql://… node --import tsx server/worker.ts
 */
import { MikroORM } from '@mikro-orm/postgresql';
import pg from 'pg';
import { loadDevEnv } from './dev-env';
import { ormOptions } from './mikro-orm.config';
import { studyLimitsFromEnv } from './studies/limits';
import { sweepOrphans } from './studies/orphans';
import { createStudyQueue, STUDY_QUEUE } from './studies/queue';
import { handBackAll, runStudy } from './studies/runner';

const SWEEP_MS = 3000;

async function main(): Promise<void> {
  loadDevEnv();
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set; start the worker through `npm start`');
  const schema = process.env.CW_DB_SCHEMA || undefined;
  const limits = studyLimitsFromEnv();
  const name = `worker ${process.pid}`;
  const log = (msg: string) => console.log(`[${name}] ${msg}`);
  const orm = await MikroORM.init(ormOptions(url, schema ? { schema } : {}));
  const pool = new pg.Pool({
    connectionString: url,
    max: 3,
    ...(schema ? { options: `-c search_path=${schema}` } : {}),
  });
  pool.on('error', (err) => log(`pool: ${err.message}`));
  const queue = createStudyQueue(url, schema, { maintain: true });
  const boss = await queue.boss();
  const ctx = { pool, em: orm.em, limits, log };

  const sweep = async () => {
    try {
      const { requeued, failed } = await sweepOrphans(pool, limits);
      for (const id of requeued) {
        log(`study ${id}: its worker stopped; resuming it from its checkpoint`);
        await queue.send(id, limits.budgetSeconds);
      }
      for (const id of failed)
        log(`study ${id}: its worker stopped on its last allowed run; marked failed`);
    } catch (err) {
      log(`sweep: ${err instanceof Error ? err.message : String(err)}`);
    }
  };
  await sweep();
  const sweeper = setInterval(() => void sweep(), SWEEP_MS);

  await boss.work<{ studyId: string }>(
    STUDY_QUEUE,
    { batchSize: 1, pollingIntervalSeconds: 0.5 },
    async ([job]) => {
      await runStudy(ctx, job.data.studyId);
    },
  );
  log(`taking studies from queue "${STUDY_QUEUE}"`);

  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    log(`${signal}: stopping; running studies go back to the queue`);
    clearInterval(sweeper);
    await boss.offWork(STUDY_QUEUE);
    for (const id of await handBackAll()) await queue.send(id, limits.budgetSeconds);
    await queue.stop();
    await pool.end();
    await orm.close(true);
    process.exit(0);
  };
  process.on('SIGINT', () => void stop('SIGINT'));
  process.on('SIGTERM', () => void stop('SIGTERM'));
}

main().catch((err: unknown) => {
  console.error('[worker] failed to start:', err);
  process.exit(1);
});
