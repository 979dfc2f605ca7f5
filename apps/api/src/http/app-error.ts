/**
 * The one error type of the API. Services throw it; the central error handler turns it into
 * `{error: {code, message, details}}` with `status`.
 */
export class AppError extends Error {
  override readonly name = 'AppError';

  /**
   * @param code machine-readable, snake_case (`not_found`, `csrf_missing` ...)
   * @param status HTTP status code
   * @param message a sentence for people; shown by the client as is
   * @param details optional structured details (for example zod issue paths)
   */
  constructor(
    readonly code: string,
    readonly status: number,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }
}

/** 400 with the issues of a request that does not match its schema. */
export function invalidRequest(message: string, details?: unknown): AppError {
  return new AppError('invalid_request', 400, message, details);
}

/** 401: no valid session. */
export function unauthenticated(message = 'Sign in to continue.'): AppError {
  return new AppError('unauthenticated', 401, message);
}

/** 403: signed in, but not allowed. */
export function forbidden(message: string, details?: unknown): AppError {
  return new AppError('forbidden', 403, message, details);
}

/** 404 naming what was not found. */
export function notFound(message: string): AppError {
  return new AppError('not_found', 404, message);
}

/** 409: the request conflicts with the current state. */
export function conflict(code: string, message: string, details?: unknown): AppError {
  return new AppError(code, 409, message, details);
}
