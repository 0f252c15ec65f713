import { HttpErrorResponse } from '@angular/common/http';
import { apiErrorDetails } from '../../core/http/api-error-details';
import { describeHttpError } from '../../core/http/describe-http-error';

/** Where to show why a code was refused: under the code field, or as a sentence for the whole form. */
export interface CodeFailure {
  readonly field: string | null;
  readonly general: string | null;
}

/**
 * Sorts a failed code call: a wrong or malformed code belongs under the field; a rate limit,
 * a conflict (the set-up expired, codes already on) or a refusal for the role is a sentence.
 */
export function codeFailure(error: unknown): CodeFailure {
  if (!(error instanceof HttpErrorResponse)) {
    return { field: null, general: 'The code could not be checked. Try again.' };
  }
  const details = apiErrorDetails(error);
  const fieldText = details?.fields?.['code'];
  if (fieldText) {
    return { field: fieldText, general: null };
  }
  const isServerWordingBest = [401, 403, 409, 429].includes(error.status) && !!details;
  return { field: null, general: isServerWordingBest && details ? details.message : describeHttpError(error) };
}
