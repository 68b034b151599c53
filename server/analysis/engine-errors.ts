import { ChainValidationError, StageParameterError } from '../../shared/engine/errors';
import { HttpError } from '../common/errors';

/**
 * The engine's refusal of a chain as a 422 `invalid-chain` with the issues as details, or
 * null when `err` is something else (a fault, passed on as it is).
 */
export function invalidChainError(err: unknown): HttpError | null {
  if (err instanceof ChainValidationError) {
    return new HttpError(422, 'invalid-chain', err.message, err.issues);
  }
  if (err instanceof StageParameterError) {
    return new HttpError(422, 'invalid-chain', err.message, [
      { param: err.param, path: [], message: err.message },
    ]);
  }
  return null;
}
