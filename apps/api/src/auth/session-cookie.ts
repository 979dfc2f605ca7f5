import type { CookieOptions, Response } from 'express';
import { SESSION_COOKIE } from '@keelson/contracts';
import { SESSION_TTL_SECONDS } from './session-token';

/** Attributes of the session cookie: httpOnly, SameSite=Strict, Path=/, Secure on https. */
export function sessionCookieOptions(isSecure: boolean): CookieOptions {
  return { httpOnly: true, sameSite: 'strict', path: '/', secure: isSecure };
}

/** Sets the session cookie with the token, for the session lifetime. */
export function setSessionCookie(res: Response, token: string, isSecure: boolean): void {
  res.cookie(SESSION_COOKIE, token, {
    ...sessionCookieOptions(isSecure),
    maxAge: SESSION_TTL_SECONDS * 1000,
  });
}

/** Removes the session cookie. */
export function clearSessionCookie(res: Response, isSecure: boolean): void {
  res.clearCookie(SESSION_COOKIE, sessionCookieOptions(isSecure));
}
