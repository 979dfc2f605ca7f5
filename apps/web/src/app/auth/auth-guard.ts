import { inject } from '@angular/core';
import { type CanActivateFn, Router, type UrlTree } from '@angular/router';
import type { Role } from '@keelson/contracts';
import { DEFAULT_AFTER_SIGN_IN } from './return-url';
import { Session } from './session';

/** Path of the sign-in page. */
export const SIGN_IN_PATH = '/sign-in';
/** Path of the page shown when a role may not open a page. */
export const FORBIDDEN_PATH = '/forbidden';

/** The sign-in page's address that brings the person back to `returnUrl` afterwards. */
export function signInUrlTree(router: Router, returnUrl: string): UrlTree {
  return router.createUrlTree([SIGN_IN_PATH], { queryParams: { returnUrl } });
}

/** Lets signed-in people through; sends everyone else to sign-in with a return address. */
export const signedInGuard: CanActivateFn = async (_route, state) => {
  const router = inject(Router);
  const user = await inject(Session).restore();
  return user ? true : signInUrlTree(router, state.url);
};

/** Keeps signed-in people off the sign-in page (they go home instead). */
export const signedOutGuard: CanActivateFn = async () => {
  const router = inject(Router);
  const user = await inject(Session).restore();
  return user ? router.parseUrl(DEFAULT_AFTER_SIGN_IN) : true;
};

/**
 * A guard that lets through only the given roles. Signed-out visitors go to sign-in with a
 * return address; signed-in people of another role see the forbidden page, which names the page
 * they asked for.
 */
export function roleGuard(...roles: readonly Role[]): CanActivateFn {
  if (roles.length === 0) {
    throw new Error('roleGuard: give at least one role; a page nobody may open is a mistake.');
  }
  return async (_route, state) => {
    const router = inject(Router);
    const session = inject(Session);
    const user = await session.restore();
    if (!user) {
      return signInUrlTree(router, state.url);
    }
    if (session.hasRole(...roles)) {
      return true;
    }
    return router.createUrlTree([FORBIDDEN_PATH], { queryParams: { page: state.url } });
  };
}
