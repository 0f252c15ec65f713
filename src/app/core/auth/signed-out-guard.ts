import { inject } from '@angular/core';
import { CanActivateFn, Router } from '@angular/router';
import { homePathFor } from '../shell/navigation';
import { AuthSession } from './auth-session';

/** Keeps the sign-in page for people who are signed out; the signed-in go to their home page. */
export const signedOutGuard: CanActivateFn = () => {
  const user = inject(AuthSession).user();
  return user ? inject(Router).parseUrl(homePathFor(user.role)) : true;
};
