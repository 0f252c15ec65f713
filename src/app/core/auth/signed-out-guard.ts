import { inject } from '@angular/core';
import { CanActivateFn, Router } from '@angular/router';
import { homePathFor } from '../shell/navigation';
import { AuthSession } from './auth-session';

/**
 * Keeps the sign-in page for people who are signed out, or whose one-time code is still due
 * (the page then asks for it); the signed-in go to their home page.
 */
export const signedOutGuard: CanActivateFn = () => {
  const session = inject(AuthSession);
  const user = session.user();
  return user && session.isSignedIn() ? inject(Router).parseUrl(homePathFor(user.role)) : true;
};
