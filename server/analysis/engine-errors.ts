import { ChainValidationError, StageParameterError } from '../../shared/engine/errors';
import type { AnalysisOutcome } from './analysis-task';

export type Refusal = Extract<AnalysisOutcome, { kind: 'refused' }>;

/**
 * The engine's refusal of a chain as plain data for the event loop (a thrown error loses its
 * class and fields between threads), which answers it with 422 `invalid-chain` and the issues
 * as details; null when `err` is something else (a fault, passed on as it is).
 */
export function engineRefusal(err: unknown): Refusal | null {
  if (err instanceof ChainValidationError) {
    return { kind: 'refused', message: err.message, details: err.issues };
  }
  if (err instanceof StageParameterError) {
    return {
      kind: 'refused',
      message: err.message,
      details: [{ param: err.param, path: [], message: err.message }],
    };
  }
  return null;
}
