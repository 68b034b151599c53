/**
 * Typed HTTP errors. Handlers throw them; the error middleware (common/error-handler.ts)
 * turns each into `{ error, message, details }` with its status.
 */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    /** A short machine-readable code, e.g. `stale-version`. */
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = new.target.name;
  }
}

export class BadRequestError extends HttpError {
  constructor(message: string, details?: unknown) {
    super(400, 'bad-request', message, details);
  }
}

export class UnauthorizedError extends HttpError {
  constructor(message = 'sign in first') {
    super(401, 'not-signed-in', message);
  }
}

export class ForbiddenError extends HttpError {
  constructor(message: string, code = 'forbidden') {
    super(403, code, message);
  }
}

export class NotFoundError extends HttpError {
  constructor(message: string) {
    super(404, 'not-found', message);
  }
}

export class ConflictError extends HttpError {
  constructor(code: string, message: string, details?: unknown) {
    super(409, code, message, details);
  }
}

/** A body or query that parsed but breaks the rules; details list `{ path, message }`. */
export class ValidationError extends HttpError {
  constructor(message: string, details: { path: string; message: string }[]) {
    super(422, 'invalid', message, details);
  }
}
