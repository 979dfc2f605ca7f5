import type { Request } from 'express';
import type { Role } from '@keelson/contracts';

/** The signed-in user as every request sees it: re-read from the database per request. */
export interface SessionUser {
  id: number;
  email: string;
  name: string;
  role: Role;
  /** Plants the user manages (plant managers only; empty otherwise). */
  plantCodes: string[];
}

/** How a request proved who it is. */
export type SessionSource = 'cookie' | 'bearer';

/** The authentication of one request. */
export interface AuthContext {
  user: SessionUser;
  via: SessionSource;
}

declare global {
  // Express's own extension point; merged into its Request type.
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      /** Set by the authentication middleware when the request carries a valid session. */
      auth?: AuthContext;
      /** Why a presented token was not accepted (expired, tampered, user gone or inactive). */
      authFailure?: string;
    }
  }
}

/** The signed-in user of a request; only call it in routes that require a role. */
export function sessionUser(req: Request): SessionUser {
  if (!req.auth) {
    // The route helper refuses unauthenticated requests before a handler runs.
    throw new Error(`No session on ${req.method} ${req.originalUrl}: is the route declared?`);
  }
  return req.auth.user;
}
