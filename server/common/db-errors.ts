import { DriverException } from '@mikro-orm/core';

/** Error codes of Node's sockets that mean the database could not be reached. */
const SOCKET_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ECONNABORTED',
  'ETIMEDOUT',
  'EPIPE',
  'ENOTFOUND',
  'EHOSTUNREACH',
  'ENETUNREACH',
  'EAI_AGAIN',
]);

/** Messages of pg and knex when a connection is lost or cannot be had. */
const LOST_CONNECTION =
  /Connection terminated|is not queryable|Cannot use a pool after calling end|timeout exceeded when trying to connect|Query read timeout|Timeout acquiring a connection|server closed the connection|terminating connection due to administrator command|the database system is (starting up|shutting down|in recovery mode)/i;

interface Coded {
  code?: unknown;
  message?: unknown;
  cause?: unknown;
  previous?: unknown;
  errors?: unknown;
}

/** The error and the errors it wraps (MikroORM's `previous`, `cause`, AggregateError). */
function* chain(err: unknown, depth = 0): Generator<Coded> {
  if (!err || typeof err !== 'object' || depth > 5) return;
  const e = err as Coded;
  yield e;
  yield* chain(e.previous, depth + 1);
  yield* chain(e.cause, depth + 1);
  if (Array.isArray(e.errors)) for (const inner of e.errors) yield* chain(inner, depth + 1);
}

/**
 * Whether `err` says the database is away (refused, dropped, shutting down or starting up,
 * PostgreSQL class 08 and 57P0x): the request may succeed later, so it is a 503, not a 500.
 */
export function isDatabaseUnavailable(err: unknown): boolean {
  for (const e of chain(err)) {
    const code = typeof e.code === 'string' ? e.code : '';
    if (SOCKET_CODES.has(code) || code.startsWith('08') || /^57P0[1-3]$/.test(code)) return true;
    if (typeof e.message === 'string' && LOST_CONNECTION.test(e.message)) return true;
  }
  return false;
}

/** PostgreSQL SQLSTATE of a driver error, or ''. */
export function sqlState(err: unknown): string {
  return err instanceof DriverException && typeof err.code === 'string' ? err.code : '';
}

/**
 * What may be logged of an error: its kind, code, constraint and the database's own
 * message, never the SQL text with its parameters (a whole chain document, a password hash).
 */
export function loggableError(err: unknown): Record<string, unknown> {
  if (err instanceof DriverException) {
    const raw = err as DriverException & { constraint?: string; table?: string };
    return {
      type: err.name,
      code: err.code,
      constraint: raw.constraint,
      table: raw.table,
      // MikroORM's message is "<sql with values> - <database message>": keep the last part.
      message: err.message.split(' - ').pop(),
    };
  }
  if (err instanceof Error) {
    return { type: err.name, message: err.message.slice(0, 500), stack: err.stack };
  }
  return { type: typeof err, message: String(err).slice(0, 500) };
}
