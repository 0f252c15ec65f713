import { HttpErrorResponse } from '@angular/common/http';
import { apiErrorDetails } from '../../core/http/api-error-details';
import { describeHttpError } from '../../core/http/describe-http-error';

/** Why a write failed, in one sentence: the server's own words where it gave them (e.g. "a reported cycle stays"). */
export function failureSentence(error: unknown): string {
  if (!(error instanceof HttpErrorResponse)) return 'That did not work. Try again.';
  const details = apiErrorDetails(error);
  return details && error.status < 500 ? details.message : describeHttpError(error);
}
