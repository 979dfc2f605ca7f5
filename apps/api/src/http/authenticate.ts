import type { Request, RequestHandler } from 'express';
import { SESSION_COOKIE } from '@keelson/contracts';
import type { SessionSource, SessionUser } from './auth-context';

/** The answer of a session resolver: the user, or why the token was refused. */
export type SessionResolution = { user: SessionUser } | { failure: string };

/** Turns a presented token into the current user (verifying it and re-reading the user). */
export type SessionResolver = (token: string) => SessionResolution;

/** A token found on a request, and where. */
export interface PresentedToken {
  token: string;
  via: SessionSource;
}

/** Reads the Bearer token or, failing that, the session cookie. */
export function presentedToken(req: Request): PresentedToken | null {
  const header = req.get('authorization');
  if (header !== undefined) {
    const match = /^Bearer\s+(\S+)\s*$/i.exec(header);
    return match ? { token: match[1]!, via: 'bearer' } : { token: '', via: 'bearer' };
  }
  const cookie: unknown = req.cookies?.[SESSION_COOKIE];
  if (typeof cookie === 'string' && cookie.length > 0) {
    return { token: cookie, via: 'cookie' };
  }
  return null;
}

/**
 * Middleware that sets `req.auth` when the request carries a valid session (Bearer header first,
 * then the cookie), or `req.authFailure` when it carries one that is refused. It never answers
 * by itself: each route's declared roles decide (public routes work with a stale cookie).
 */
export function authenticate(resolve: SessionResolver): RequestHandler {
  return (req, _res, next) => {
    const presented = presentedToken(req);
    if (presented) {
      const resolution = presented.token
        ? resolve(presented.token)
        : { failure: 'The Authorization header is not "Bearer <token>".' };
      if ('user' in resolution) {
        req.auth = { user: resolution.user, via: presented.via };
      } else {
        req.authFailure = resolution.failure;
      }
    }
    next();
  };
}
