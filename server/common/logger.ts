import { randomUUID } from 'node:crypto';
import type { Request, RequestHandler, Response } from 'express';
import {
  destination as pinoDestination,
  pino,
  type DestinationStream,
  type Level,
  type Logger,
} from 'pino';
import './request-types';

/** Where log lines go and from which level; default: info and up, to standard output. */
export interface LogOptions {
  level?: Level | 'silent';
  destination?: DestinationStream;
}

/** Log lines gather in memory up to this many bytes before they are written... */
const FLUSH_BYTES = 4096;
/** ...or for at most this long, ms. */
const FLUSH_MS = 500;

const buffered = new Set<ReturnType<typeof pinoDestination>>();

/**
 * Standard output (or the file descriptor `fd`) written in batches: one write per 4 KB of lines or half a second rather
 * than a system call per request (under load the per-request write cost the event loop more
 * than the line's formatting). pino flushes it synchronously when the process exits;
 * `flushLogs` does so at a shutdown.
 */
export function batchedOutput(fd = 1): DestinationStream {
  const destination = pinoDestination({ dest: fd, minLength: FLUSH_BYTES, sync: false });
  const timer = setInterval(() => {
    try {
      destination.flush();
    } catch {
      // Closed, or not open yet: the next tick (or the exit's flush) writes what is left.
    }
  }, FLUSH_MS);
  timer.unref();
  const forget = () => {
    clearInterval(timer);
    buffered.delete(destination);
  };
  destination.on('close', forget);
  // A log that can no longer be written (its descriptor closed under it) must not take the
  // process down with an unhandled 'error' event: its lines are lost, the work goes on.
  destination.on('error', forget);
  buffered.add(destination);
  return destination;
}

/** Writes every batched log line out now (at shutdown, before the process exits). */
export function flushLogs(): void {
  for (const destination of buffered) {
    try {
      destination.flushSync();
    } catch {
      // Not open yet or already closed: nothing of ours is waiting in it.
    }
  }
}

/**
 * The server's structured logger (one JSON object per line), to `opts.destination` or else
 * to standard output in batches.
 */
export function createLogger(opts: LogOptions = {}): Logger {
  return pino(
    {
      level: opts.level ?? 'info',
      base: { app: 'chainwright' },
      // Defence in depth: were a request or its headers ever logged, these stay out.
      redact: {
        paths: ['req.headers.cookie', 'req.headers["x-csrf-token"]', 'password', '*.password'],
        remove: true,
      },
    },
    opts.destination ?? batchedOutput(),
  );
}

const REQUEST_ID = /^[A-Za-z0-9._-]{1,64}$/;

/** The matched route pattern (e.g. `/api/chains/:id`), never the raw path with its ids. */
function routeOf(req: Request): string {
  const route = (req as Request & { route?: { path?: unknown } }).route;
  if (route && typeof route.path === 'string') return `${req.baseUrl ?? ''}${route.path}`;
  // Unmatched (404) or left through an error: the path without the query string.
  return (req.originalUrl ?? req.url).split('?')[0].slice(0, 200);
}

/** The one line written per request: no body, no headers, no query string. */
function requestLine(r: Request, res: Response, ms: number) {
  return {
    method: r.method,
    route: routeOf(r),
    status: res.statusCode,
    ms,
    userId: r.user?.id ?? null,
  };
}

/**
 * One structured line per request when it ends (method, route, status, time in ms, user id,
 * request id), written as pino-http wrote it. The request id comes from a well-formed
 * `x-request-id` header (a proxy's) or is made here, and is sent back in `x-request-id`;
 * `req.log` is a child logger carrying it. Failures are logged by the error middleware with
 * their cause; this line only says that the request ended. (pino-http itself also built a
 * child logger per request with the whole request serialised and redacted, unused here,
 * which cost the event loop more than the line.)
 */
export function requestLogger(logger: Logger): RequestHandler {
  return (req, res, next) => {
    const given = req.headers['x-request-id'];
    const id = typeof given === 'string' && REQUEST_ID.test(given) ? given : randomUUID();
    res.setHeader('x-request-id', id);
    req.id = id;
    req.log = logger.child({ reqId: id });
    const started = Date.now();
    const complete = () => {
      res.removeListener('close', complete);
      res.removeListener('finish', complete);
      logger.info({ reqId: id, ...requestLine(req, res, Date.now() - started) }, 'request');
    };
    res.on('close', complete);
    res.on('finish', complete);
    next();
  };
}
