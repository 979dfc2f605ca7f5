import { HttpErrorResponse } from '@angular/common/http';
import type { ApiErrorBody } from '@keelson/contracts';

/** Shown when the server cannot be reached at all (status 0: offline, refused, CORS). */
export const UNREACHABLE_MESSAGE =
  'Keelson cannot reach its server. Check your connection and try again.';

/** Shown when a failed response carries no readable `{error: {message}}` body. */
export const UNKNOWN_ERROR_MESSAGE = 'Something went wrong on the server. Please try again.';

/** True when `body` has the shape of the API's error body. */
export function isApiErrorBody(body: unknown): body is ApiErrorBody {
  if (typeof body !== 'object' || body === null || !('error' in body)) {
    return false;
  }
  const error = (body as { error: unknown }).error;
  return (
    typeof error === 'object' &&
    error !== null &&
    typeof (error as { message?: unknown }).message === 'string'
  );
}

/**
 * The message to show a person for a failed API call: the API's own `error.message` when it sent
 * one, otherwise a plain sentence for "unreachable" or "unknown".
 */
export function apiErrorMessage(error: unknown): string {
  if (error instanceof HttpErrorResponse) {
    if (isApiErrorBody(error.error)) {
      return error.error.error.message;
    }
    return error.status === 0 ? UNREACHABLE_MESSAGE : UNKNOWN_ERROR_MESSAGE;
  }
  return UNKNOWN_ERROR_MESSAGE;
}

/** The API's machine-readable error code of a failed call, when it sent one. */
export function apiErrorCode(error: unknown): string | null {
  if (error instanceof HttpErrorResponse && isApiErrorBody(error.error)) {
    return error.error.error.code;
  }
  return null;
}
