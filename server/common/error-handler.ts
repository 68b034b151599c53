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
import { HttpError } from './errors';
import { zodDetails } from './validate';

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
  if (err instanceof UniqueConstraintViolationException) {
    return { status: 409, body: { error: 'duplicate', message: 'that already exists' } };
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

/** The one error middleware: maps typed errors, zod and body-parser errors to JSON. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  const { status, body } = toDto(err);
  // Deliberate HttpErrors (e.g. 503 engine unavailable) are answers, not failures: log the rest.
  if (status >= 500 && !(err instanceof HttpError))
    console.error(`[server] ${req.method} ${req.originalUrl}:`, err);
  if (res.headersSent) return;
  res.status(status).json(body);
};

/** JSON 404 for any /api path no route matched. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new NotFoundErrorFor(req.method, req.originalUrl));
};

class NotFoundErrorFor extends HttpError {
  constructor(method: string, url: string) {
    super(404, 'no-such-route', `no API route ${method} ${url.split('?')[0]}`);
  }
}
