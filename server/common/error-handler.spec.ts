import { DriverException, UniqueConstraintViolationException } from '@mikro-orm/core';
import { z } from 'zod';
import { ConflictError } from './errors';
import type { Request, Response } from 'express';
import { createErrorHandler, toDto } from './error-handler';

describe('toDto', () => {
  it('should keep a typed error status, code and details', () => {
    expect(toDto(new ConflictError('stale-version', 'reload', { currentVersion: 3 }))).toEqual({
      status: 409,
      body: { error: 'stale-version', message: 'reload', details: { currentVersion: 3 } },
    });
  });

  it('should turn a zod error into 422 with a path per issue', () => {
    const result = z.object({ a: z.object({ b: z.number() }) }).safeParse({ a: { b: 'x' } });
    const dto = toDto(result.error);
    expect(dto.status).toBe(422);
    expect(dto.body.details).toEqual([{ path: 'a.b', message: expect.any(String) }]);
  });

  it('should map body-parser failures to 400 and 413', () => {
    expect(toDto({ type: 'entity.parse.failed', status: 400 }).status).toBe(400);
    expect(toDto({ type: 'entity.too.large', status: 413, limit: 1024 })).toEqual({
      status: 413,
      body: {
        error: 'too-large',
        message: 'the request body is larger than the limit of 1024 bytes',
      },
    });
  });

  it('should map a PostgreSQL data exception to 422 and a duplicate to 409', () => {
    const outOfRange = Object.assign(new Error('update ... - integer out of range'), {
      code: '22003',
    });
    expect(toDto(new DriverException(outOfRange))).toMatchObject({
      status: 422,
      body: { message: 'a value cannot be stored: integer out of range' },
    });
    const duplicate = new UniqueConstraintViolationException(
      Object.assign(new Error('dup'), { code: '23505' }),
    );
    expect(toDto(duplicate).status).toBe(409);
  });

  it('should hide the details of anything else behind a 500', () => {
    expect(toDto(new Error('secret connection string'))).toEqual({
      status: 500,
      body: { error: 'internal', message: 'the server failed; the error is in its log' },
    });
  });
});

describe('createErrorHandler', () => {
  /** Runs the middleware on `err` and resolves with the status, body and Retry-After sent. */
  function run(err: unknown, probe: () => Promise<boolean>) {
    return new Promise<{ status: number; body: unknown; retryAfter?: string }>(
      (resolve, reject) => {
        const headers: Record<string, string> = {};
        let status = 0;
        const res = {
          headersSent: false,
          setHeader: (k: string, v: string) => (headers[k] = v),
          status(code: number) {
            status = code;
            return this;
          },
          json: (body: unknown) => resolve({ status, body, retryAfter: headers['Retry-After'] }),
        } as unknown as Response;
        const req = {
          log: { warn: () => undefined, error: () => undefined },
        } as unknown as Request;
        createErrorHandler(probe)(err, req, res, reject);
      },
    );
  }

  it('should answer 503 for an unrecognised error while the database does not answer', async () => {
    const answer = await run(new Error('Transaction query already complete'), async () => false);
    expect(answer.status).toBe(503);
    expect(answer.retryAfter).toBe('5');
    expect(answer.body).toMatchObject({ error: 'db-unavailable' });
  });

  it('should keep the 500 when the database answers, and a failing probe counts as down', async () => {
    expect((await run(new Error('a bug'), async () => true)).status).toBe(500);
    const thrown = await run(new Error('a bug'), () => Promise.reject(new Error('probe')));
    expect(thrown.status).toBe(503);
  });

  it('should not ask the database about an answer that is not a 500', async () => {
    const probe = jest.fn(async () => false);
    expect((await run(new ConflictError('stale-version', 'reload'), probe)).status).toBe(409);
    expect(probe).not.toHaveBeenCalled();
  });
});
