import { inject } from '@angular/core';
import { CanActivateFn, Router } from '@angular/router';
import { AuthSession } from './auth-session';
import { SIGN_IN_PATH } from './sign-in-path';

/** Lets signed-in people through; sends everyone else to sign in, remembering where they were going. */
export const authGuard: CanActivateFn = (_route, state) => {
  if (inject(AuthSession).isSignedIn()) {
    return true;
  }
  return inject(Router).createUrlTree([SIGN_IN_PATH], { queryParams: { returnUrl: state.url } });
};
