import { HttpErrorResponse, type HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { Router } from '@angular/router';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '@keelson/contracts';
import { catchError, throwError } from 'rxjs';
import { LOGIN_URL, ME_URL } from './auth-api';
import { SIGN_IN_PATH, signInUrlTree } from './auth-guard';
import { Session } from './session';

/** True for requests to Keelson's own API (same origin, under /api). */
export function isApiRequest(url: string): boolean {
  return url === '/api' || url.startsWith('/api/') || url.startsWith('/api?');
}

/** The path part of a request URL (without query string), for comparing with known endpoints. */
function pathOf(url: string): string {
  const end = url.search(/[?#]/);
  return end === -1 ? url : url.slice(0, end);
}

/**
 * For every `/api` request: sends the session cookie (`withCredentials`) and the CSRF header the
 * server requires on state-changing calls. When the API answers 401 (session expired, user
 * deactivated) to anything but the "who am I" and login calls, forgets the session and sends the
 * person to sign-in with a way back to where they were. The error still reaches the caller.
 */
export const apiInterceptor: HttpInterceptorFn = (request, next) => {
  if (!isApiRequest(request.url)) {
    return next(request);
  }
  const session = inject(Session);
  const router = inject(Router);
  const withSession = request.clone({
    withCredentials: true,
    setHeaders: { [CSRF_HEADER]: CSRF_HEADER_VALUE },
  });
  return next(withSession).pipe(
    catchError((error: unknown) => {
      const path = pathOf(request.url);
      if (
        error instanceof HttpErrorResponse &&
        error.status === 401 &&
        path !== ME_URL &&
        path !== LOGIN_URL
      ) {
        session.clear();
        const here = router.url;
        if (!here.startsWith(SIGN_IN_PATH)) {
          void router.navigateByUrl(signInUrlTree(router, here));
        }
      }
      return throwError(() => error);
    }),
  );
};
