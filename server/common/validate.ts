import type { z } from 'zod';
import { ValidationError } from './errors';

/** `[{ path: 'settings.f0Hz', message }]` from a zod error, for 422 details. */
export function zodDetails(error: z.ZodError): { path: string; message: string }[] {
  return error.issues.map((issue) => ({
    path: issue.path.map(String).join('.') || '(body)',
    message: issue.message,
  }));
}

/**
 * Parses `input` with `schema`, or throws a 422 ValidationError naming every field at
 * fault. `what` names the input in the message ("request body", "query").
 */
export function parseOr422<S extends z.ZodType>(
  schema: S,
  input: unknown,
  what = 'request body',
): z.infer<S> {
  const result = schema.safeParse(input);
  if (!result.success) {
    const details = zodDetails(result.error);
    const first = details[0];
    throw new ValidationError(
      `${what} is invalid: ${first.path}: ${first.message}` +
        (details.length > 1 ? ` (and ${details.length - 1} more)` : ''),
      details,
    );
  }
  return result.data;
}
