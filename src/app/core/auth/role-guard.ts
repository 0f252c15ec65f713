import { inject } from '@angular/core';
import { CanActivateFn, Router } from '@angular/router';
import type { Role } from '@tidemark/shared';
import { homePathFor } from '../shell/navigation';
import { AuthSession } from './auth-session';
import { SIGN_IN_PATH } from './sign-in-path';

/**
 * Lets through only the given roles. Anyone else lands on their own home page
 * rather than an error, since the link that brought them there was stale or typed.
 */
export function roleGuard(...allowed: readonly Role[]): CanActivateFn {
  return (_route, state) => {
    const router = inject(Router);
    const user = inject(AuthSession).user();
    if (!user) {
      return router.createUrlTree([SIGN_IN_PATH], { queryParams: { returnUrl: state.url } });
    }
    return allowed.includes(user.role) ? true : router.parseUrl(homePathFor(user.role));
  };
}
