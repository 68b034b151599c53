import type { ErrorRequestHandler, RequestHandler } from 'express';
import {
  DriverException,
  NotFoundError as OrmNotFoundError,
  OptimisticLockError,
  UniqueConstraintViolationException,
} from '@mikro-orm/core';
import { z } from 'zod';
import type { ApiErrorDto } from '../../shared/schema/api';
import { CSRF_ERROR_CODE } from '../auth/csrf-code';
import { isDatabaseUnavailable, loggableError, sqlState } from './db-errors';
import { HttpError } from './errors';
import { zodDetails } from './validate';

/** Seconds a client should wait before retrying while the database is away. */
export const RETRY_AFTER_SECONDS = 5;

/** The answer while the database is away. */
const DB_UNAVAILABLE: { status: number; body: ApiErrorDto } = {
  status: 503,
  body: {
    error: 'db-unavailable',
    message: `the database cannot be reached just now; try again in ${RETRY_AFTER_SECONDS} seconds`,
  },
};

/** Errors body-parser raises, recognised by their `type`. */
interface BodyParserError {
  type?: string;
  code?: string;
  status?: number;
  limit?: number;
}

/** The status and JSON body for any thrown value (exported for its unit test). */
export function toDto(err: unknown): { status: number; body: ApiErrorDto } {
  if (err instanceof HttpError) {
    return {
      status: err.status,
      body: { error: err.code, message: err.message, details: err.details },
    };
  }
  if (err instanceof z.ZodError) {
    const details = zodDetails(err);
    return {
      status: 422,
      body: { error: 'invalid', message: `${details[0]?.path}: ${details[0]?.message}`, details },
    };
  }
  const bp = err as BodyParserError;
  if (bp?.type === 'entity.parse.failed') {
    return {
      status: 400,
      body: { error: 'malformed-json', message: 'the request body is not valid JSON' },
    };
  }
  if (bp?.type === 'entity.shape.refused') {
    return { status: 400, body: { error: 'body-shape', message: (err as Error).message } };
  }
  if (bp?.type === 'entity.too.large') {
    return {
      status: 413,
      body: {
        error: 'too-large',
        message: `the request body is larger than the limit of ${bp.limit} bytes`,
      },
    };
  }
  if (bp?.type === 'encoding.unsupported' || bp?.type === 'charset.unsupported') {
    return {
      status: 415,
      body: { error: 'unsupported-encoding', message: 'send the body as UTF-8 JSON' },
    };
  }
  if (bp?.code === CSRF_ERROR_CODE) {
    return { status: 403, body: { error: 'csrf', message: (err as Error).message } };
  }
  if (err instanceof OrmNotFoundError) {
    return { status: 404, body: { error: 'not-found', message: err.message } };
  }
  if (err instanceof OptimisticLockError) {
    return {
      status: 409,
      body: { error: 'stale-version', message: 'someone saved this in the meantime; reload it' },
    };
  }
  if (isDatabaseUnavailable(err)) return DB_UNAVAILABLE;
  const state = sqlState(err);
  // Deadlock or serialisation failure between two requests: the retry will go through.
  if (state === '40P01' || state === '40001') {
    return {
      status: 503,
      body: {
        error: 'busy',
        message: 'the database was busy with a conflicting change; try again',
      },
    };
  }
  if (err instanceof UniqueConstraintViolationException) {
    return { status: 409, body: { error: 'duplicate', message: 'that already exists' } };
  }
  // A foreign key: on insert or update, a row this one refers to was deleted meanwhile (a
  // request racing a delete); on delete, other rows still refer to the one being deleted.
  if (state === '23503') {
    const onDelete = /update or delete on table/.test((err as Error).message);
    return {
      status: 409,
      body: onDelete
        ? { error: 'in-use', message: 'other records still refer to this; remove them first' }
        : {
            error: 'gone',
            message: 'something this refers to was deleted meanwhile; reload and try again',
          },
    };
  }
  // Any other integrity rule (not null, check, exclusion): the request's data broke it.
  if (state.startsWith('23')) {
    return {
      status: 409,
      body: {
        error: 'conflict',
        message: `the change breaks a rule of the stored data: ${(err as Error).message.split(' - ').pop()}`,
      },
    };
  }
  // PostgreSQL class 22 (data exception): a value the column cannot hold, e.g. an integer
  // out of range. It is the request's fault, not the server's.
  if (err instanceof DriverException && (err.code ?? '').startsWith('22')) {
    return {
      status: 422,
      body: {
        error: 'invalid',
        message: `a value cannot be stored: ${err.message.split(' - ').pop()}`,
      },
    };
  }
  if (typeof bp?.status === 'number' && bp.status >= 400 && bp.status < 500) {
    return { status: bp.status, body: { error: 'bad-request', message: (err as Error).message } };
  }
  return {
    status: 500,
    body: { error: 'internal', message: 'the server failed; the error is in its log' },
  };
}

/** Answers whether the database is reachable right now (a `select 1` with a short timeout). */
export type DatabaseProbe = () => Promise<boolean>;

/**
 * The one error middleware: maps typed errors, zod, body-parser and database errors to
 * JSON. Failures are logged through the request's logger with the error's kind and the
 * database's message, never a request body or SQL parameters.
 *
 * An error no rule recognises would be a 500. When the database is going away, the driver
 * and the pool fail in many ways whose messages no list keeps up with (a rollback on a
 * dropped connection, a client closed mid-query), so before answering 500 the handler asks
 * `probe` whether the database answers: if it does not, the failure is the outage's and the
 * answer is 503 with Retry-After like any other refused request.
 */
export function createErrorHandler(probe?: DatabaseProbe): ErrorRequestHandler {
  return (err, req, res, next) => {
    const mapped = toDto(err);
    if (!probe || mapped.status !== 500 || err instanceof HttpError) {
      answer(err, req, res, mapped);
      return;
    }
    probe()
      .catch(() => false)
      .then((up) => answer(err, req, res, up ? mapped : DB_UNAVAILABLE))
      .catch(next);
  };
}

/** The error middleware without a database probe (an unrecognised error is a 500). */
export const errorHandler: ErrorRequestHandler = createErrorHandler();

function answer(
  err: unknown,
  req: Parameters<ErrorRequestHandler>[1],
  res: Parameters<ErrorRequestHandler>[2],
  { status, body }: { status: number; body: ApiErrorDto },
): void {
  const log = req.log;
  if (status === 503 && body.error === 'db-unavailable') {
    log?.warn({ err: loggableError(err) }, 'database unavailable');
  } else if (status >= 500 && !(err instanceof HttpError)) {
    // Deliberate HttpErrors (e.g. 503 engine unavailable) are answers, not failures.
    if (log) log.error({ err: loggableError(err) }, 'request failed');
    else console.error('[server] request failed:', loggableError(err));
  }
  if (res.headersSent) return;
  if (status === 503) res.setHeader('Retry-After', String(RETRY_AFTER_SECONDS));
  res.status(status).json(body);
}

/** JSON 404 for any /api path no route matched. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new NotFoundErrorFor(req.method, req.originalUrl));
};

class NotFoundErrorFor extends HttpError {
  constructor(method: string, url: string) {
    super(404, 'no-such-route', `no API route ${method} ${url.split('?')[0]}`);
  }
}
