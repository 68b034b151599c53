import type pg from 'pg';
import { SESSION_TABLE } from '../mikro-orm.config';
import { forgetCachedSessions } from './session-cache';

/**
 * Ends every stored session of `userId` except `keepSid` (the caller's own, when the
 * account holder changed their password while signed in). Passport keeps the user id at
 * sess.passport.user.
 */
export async function endSessionsOf(
  pool: pg.Pool,
  schema: string | undefined,
  userId: string,
  keepSid?: string,
): Promise<number> {
  const table = `"${(schema ?? 'public').replace(/"/g, '""')}"."${SESSION_TABLE}"`;
  const result = await pool.query(
    `delete from ${table} where sess -> 'passport' ->> 'user' = $1 and sid <> $2`,
    [userId, keepSid ?? ''],
  );
  forgetCachedSessions();
  return result.rowCount ?? 0;
}
