import { HttpErrorResponse, HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { catchError, throwError } from 'rxjs';
import { describeHttpError } from './describe-http-error';
import { ErrorNotice } from './error-notice';
import { SHOWS_OWN_ERRORS } from './shows-own-errors';

/**
 * Reports a failed request once, as a sentence in a snack bar, unless the caller
 * asked to show errors itself (see `showsOwnErrors()`).
 */
export const errorNoticeInterceptor: HttpInterceptorFn = (request, next) => {
  const notice = inject(ErrorNotice);

  return next(request).pipe(
    catchError((error: unknown) => {
      if (error instanceof HttpErrorResponse && !request.context.get(SHOWS_OWN_ERRORS) && !isAuthAnswer(request.url, error)) {
        notice.show(describeHttpError(error));
      }
      return throwError(() => error);
    }),
  );
};

/** A 401 from `/api/auth/*` just means "not signed in"; nothing to announce. */
function isAuthAnswer(url: string, error: HttpErrorResponse): boolean {
  return error.status === 401 && url.startsWith('/api/auth/');
}
