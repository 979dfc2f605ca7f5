import type { Request, RequestHandler, Response, Router } from 'express';
import { ROLE_LABELS, ROLES, type Role } from '@keelson/contracts';
import { AppError, unauthenticated } from './app-error';
import { csrfGuard, type CsrfPolicy } from './csrf';

/** HTTP methods a route can declare. */
export type RouteMethod = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** Who may call a route: `'public'` or a non-empty list of roles. */
export type RouteAccess = 'public' | readonly [Role, ...Role[]];

/** Every role: for routes open to anyone signed in. */
export const SIGNED_IN: readonly [Role, ...Role[]] = ROLES;

/** One route: method, path (relative to its router), access, and the handler. */
export interface RouteDeclaration {
  method: RouteMethod;
  path: string;
  roles: RouteAccess;
  /** When the CSRF header is needed; see {@link CsrfPolicy}. */
  csrf?: CsrfPolicy;
  /** Extra middleware run after the role check (rate limits, uploads). */
  before?: RequestHandler[];
  handler: (req: Request, res: Response) => unknown;
}

/** Key under which the role guard of each route carries its declared access. */
export const ROUTE_ACCESS = Symbol('keelson.routeAccess');

/** A middleware tagged with the access it enforces. */
export type AccessGuard = RequestHandler & { [ROUTE_ACCESS]: RouteAccess };

/** Human list of roles: "Administrator or Risk manager". */
export function describeRoles(roles: readonly Role[]): string {
  const labels = roles.map((role) => ROLE_LABELS[role]);
  return labels.length <= 1
    ? (labels[0] ?? '')
    : `${labels.slice(0, -1).join(', ')} or ${labels[labels.length - 1]}`;
}

/** The middleware that enforces `access`: 401 without a session, 403 for another role. */
export function accessGuard(access: RouteAccess): AccessGuard {
  const guard: RequestHandler = (req, _res, next) => {
    if (access === 'public') {
      next();
      return;
    }
    const auth = req.auth;
    if (!auth) {
      next(
        req.authFailure
          ? unauthenticated('Your session has ended. Sign in again.')
          : unauthenticated(),
      );
      return;
    }
    if (!access.includes(auth.user.role)) {
      next(
        new AppError(
          'forbidden',
          403,
          `This needs the role ${describeRoles(access)}; you are signed in as ` +
            `${ROLE_LABELS[auth.user.role]}.`,
          { requiredRoles: [...access], role: auth.user.role },
        ),
      );
      return;
    }
    next();
  };
  return Object.assign(guard, { [ROUTE_ACCESS]: access });
}

/**
 * Declares a route on `router`: the CSRF check, the role guard (tagged with its access, which
 * the route registry reads back), any extra middleware, then the handler. Every route of the API
 * is declared through here; a spec fails when one is not.
 */
export function route(router: Router, declaration: RouteDeclaration): void {
  if (declaration.roles !== 'public' && declaration.roles.length === 0) {
    throw new Error(`Route ${declaration.method} ${declaration.path} declares no roles.`);
  }
  router[declaration.method](
    declaration.path,
    csrfGuard(declaration.csrf ?? 'cookie'),
    accessGuard(declaration.roles),
    ...(declaration.before ?? []),
    async (req: Request, res: Response) => {
      await declaration.handler(req, res);
    },
  );
}
