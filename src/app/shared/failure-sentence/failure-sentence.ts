import { HttpErrorResponse } from '@angular/common/http';
import { apiErrorDetails } from '../../core/http/api-error-details';
import { describeHttpError } from '../../core/http/describe-http-error';

/**
 * Why a request failed, in one sentence for the page to show beside the action: the server's
 * own words where it gave them (e.g. "The audit lead sends the governance pack."), our sentence
 * for an unreachable server or a server fault, whose text is not written for people.
 */
export function failureSentence(error: unknown, fallback = 'That did not work. Try again.'): string {
  if (!(error instanceof HttpErrorResponse)) return fallback;
  const details = apiErrorDetails(error);
  return details && error.status > 0 && error.status < 500 ? details.message : describeHttpError(error);
}
