import type { RequestHandler } from 'express';
import { CSRF_HEADER, CSRF_HEADER_VALUE, SESSION_COOKIE } from '@keelson/contracts';
import { AppError } from './app-error';

/** Methods that change state and so need the CSRF header when sent with the cookie. */
export const STATE_CHANGING_METHODS: ReadonlySet<string> = new Set([
  'POST',
  'PUT',
  'PATCH',
  'DELETE',
]);

/**
 * When a route needs the header: `'cookie'` (the default) when the request carries the session
 * cookie and is not authenticated by a Bearer token; `'always'` for sign-in and set-password,
 * which have no session yet but must not be triggered from another site either.
 */
export type CsrfPolicy = 'cookie' | 'always';

/**
 * Refuses a state-changing request with 403 `csrf_missing` unless it carries
 * `x-keelson-csrf: 1`. A page on another site cannot add a custom header to a cross-site request
 * without a CORS preflight, which this API never grants, so the header proves same-origin.
 */
export function csrfGuard(policy: CsrfPolicy): RequestHandler {
  return (req, _res, next) => {
    if (!STATE_CHANGING_METHODS.has(req.method)) {
      next();
      return;
    }
    const hasCookie = typeof req.cookies?.[SESSION_COOKIE] === 'string';
    const needsHeader =
      policy === 'always' || (hasCookie && req.auth?.via !== 'bearer');
    if (needsHeader && req.get(CSRF_HEADER) !== CSRF_HEADER_VALUE) {
      next(
        new AppError(
          'csrf_missing',
          403,
          `This request needs the header ${CSRF_HEADER}: ${CSRF_HEADER_VALUE}.`,
        ),
      );
      return;
    }
    next();
  };
}
