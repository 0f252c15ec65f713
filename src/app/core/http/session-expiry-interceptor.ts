import { HttpErrorResponse, HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { Router } from '@angular/router';
import { catchError, throwError } from 'rxjs';
import { AuthSession } from '../auth/auth-session';
import { SIGN_IN_PATH } from '../auth/sign-in-path';

/** Calls whose 401 is an answer (not signed in, wrong password), not an expired session. */
const AUTH_ENDPOINTS = '/api/auth/';

/**
 * When any other call answers 401 the server session has ended: forget the user
 * and send them to sign in, keeping where they were so they can come back.
 */
export const sessionExpiryInterceptor: HttpInterceptorFn = (request, next) => {
  const session = inject(AuthSession);
  const router = inject(Router);

  return next(request).pipe(
    catchError((error: unknown) => {
      if (error instanceof HttpErrorResponse && error.status === 401 && !request.url.startsWith(AUTH_ENDPOINTS)) {
        const returnUrl = router.url;
        session.forget();
        void router.navigate([SIGN_IN_PATH], {
          queryParams: returnUrl.startsWith(SIGN_IN_PATH) ? {} : { returnUrl },
        });
      }
      return throwError(() => error);
    }),
  );
};
