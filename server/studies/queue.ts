/**
 * The study queue: pg-boss on the product's own PostgreSQL. The web server only sends jobs;
 * workers (server/worker.ts) take them. Each job carries a study id; the study row holds
 * everything else, so a job can be sent again to resume a study.
 */
import PgBoss from 'pg-boss';

export const STUDY_QUEUE = 'chain-studies';

/** pg-boss's own schema: beside the app's schema (tests give each file its own). */
export function bossSchema(dbSchema: string | undefined): string {
  return dbSchema ? `${dbSchema}_boss` : 'pgboss';
}

export interface StudyQueue {
  send(studyId: string, budgetSeconds: number): Promise<void>;
  /** The started instance (workers subscribe through it). */
  boss(): Promise<PgBoss>;
  stop(): Promise<void>;
}

/**
 * A queue that starts pg-boss on first use. `maintain`: run pg-boss's maintenance
 * (expiry, archiving) in this process — workers do, the web server does not.
 */
export function createStudyQueue(
  databaseUrl: string,
  dbSchema: string | undefined,
  opts: { maintain: boolean },
): StudyQueue {
  let started: Promise<PgBoss> | null = null;
  const boss = () => {
    started ??= (async () => {
      const b = new PgBoss({
        connectionString: databaseUrl,
        schema: bossSchema(dbSchema),
        max: 3,
        supervise: opts.maintain,
        schedule: false,
      });
      b.on('error', (err: Error) => console.error('[queue]', err.message));
      await b.start();
      await b.createQueue(STUDY_QUEUE);
      return b;
    })();
    return started;
  };
  return {
    boss,
    async send(studyId, budgetSeconds) {
      // Retries are the study's own (resume from its checkpoint), not pg-boss's.
      await (
        await boss()
      ).send(STUDY_QUEUE, { studyId }, { retryLimit: 0, expireInSeconds: budgetSeconds + 120 });
    },
    async stop() {
      if (!started) return;
      const b = await started;
      started = null;
      await b.stop({ graceful: false, wait: true, close: true });
    },
  };
}

/**
 * Installs pg-boss's schema and the study queue (run by `scripts/db.ts migrate` as the
 * database owner, so the application role, which may not create tables, finds them ready).
 */
export async function installStudyQueue(databaseUrl: string, dbSchema?: string): Promise<void> {
  const queue = createStudyQueue(databaseUrl, dbSchema, { maintain: false });
  await queue.boss();
  await queue.stop();
}
