import { HttpErrorResponse } from '@angular/common/http';
import type { ApiErrorDto } from '../../../../shared/schema/api';
import { sentence } from '../forms/zod-validator';

/** The API's error body, when the answer carried one. */
export function apiErrorBody(error: unknown): ApiErrorDto | null {
  if (!(error instanceof HttpErrorResponse)) return null;
  const body = error.error as Partial<ApiErrorDto> | null;
  if (body && typeof body === 'object' && typeof body.message === 'string') {
    return { error: String(body.error ?? 'error'), message: body.message, details: body.details };
  }
  return null;
}

/** A sentence for the user: the server's message, or what went wrong on the way. */
export function describeHttpError(error: unknown): string {
  const body = apiErrorBody(error);
  // The server writes messages as lower-case fragments; show them as sentences.
  if (body) return sentence(body.message);
  if (error instanceof HttpErrorResponse) {
    if (error.status === 0)
      return 'The server cannot be reached. Check the connection and try again.';
    if (error.status >= 500) return `The server failed (${error.status}). Try again in a moment.`;
    return `The request failed (${error.status} ${error.statusText}).`;
  }
  return error instanceof Error ? error.message : 'Something went wrong.';
}
