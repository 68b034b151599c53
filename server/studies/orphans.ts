/**
 * Studies whose worker stopped (killed, crashed, machine lost): a running study whose
 * heartbeat is older than the limit goes back to the queue to resume from its checkpoint, or,
 * after its last allowed run, fails with the reason. Every worker sweeps now and then.
 */
import type pg from 'pg';
import type { StudyLimits } from './limits';

export async function sweepOrphans(
  pool: pg.Pool,
  limits: StudyLimits,
): Promise<{ requeued: string[]; failed: string[] }> {
  const { rows } = await pool.query<{ id: string; status: string }>(
    `update study set
       status = case when attempts >= $2 then 'failed' else 'queued' end,
       error = case when attempts >= $2
         then 'the worker running this study stopped (killed or crashed) on each of its ' || attempts || ' runs; the work up to its last checkpoint is kept'
         else null end,
       finished_at = case when attempts >= $2 then now() else null end
     where status = 'running' and heartbeat_at < now() - make_interval(secs => $1)
     returning id, status`,
    [limits.staleSeconds, limits.maxAttempts],
  );
  return {
    requeued: rows.filter((r) => r.status === 'queued').map((r) => r.id),
    failed: rows.filter((r) => r.status === 'failed').map((r) => r.id),
  };
}
