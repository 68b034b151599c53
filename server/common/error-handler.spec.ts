import { DriverException, UniqueConstraintViolationException } from '@mikro-orm/core';
import { z } from 'zod';
import { ConflictError } from './errors';
import { toDto } from './error-handler';

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
