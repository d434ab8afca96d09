import { inject } from '@angular/core';
import { Router, type CanActivateFn } from '@angular/router';
import { Auth } from './auth';
import type { Role } from './models';

/** The page where a signed-in user changes their password. */
export const CHANGE_PASSWORD = '/account/password';

/**
 * A route guard: signed in, and (when roles are given) in one of them. Not signed in → the
 * sign-in page, coming back after; signed in with an invitation's password → the page that
 * replaces it first, coming back after; signed in with another role → the "not allowed" page.
 */
export function roleGuard(...roles: Role[]): CanActivateFn {
  return (_route, state) => {
    const auth = inject(Auth);
    const router = inject(Router);
    if (!auth.signedIn()) {
      return router.createUrlTree(['/sign-in'], { queryParams: { next: state.url } });
    }
    if (auth.mustChangePassword() && !state.url.startsWith(CHANGE_PASSWORD)) {
      return router.createUrlTree([CHANGE_PASSWORD], { queryParams: { next: state.url } });
    }
    if (roles.length > 0 && !auth.hasRole(...roles)) {
      return router.createUrlTree(['/not-allowed'], { queryParams: { from: state.url } });
    }
    return true;
  };
}
