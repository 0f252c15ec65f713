import { HttpErrorResponse } from '@angular/common/http';
import type { FormGroup } from '@angular/forms';
import { apiErrorDetails } from '../../core/http/api-error-details';
import { describeHttpError } from '../../core/http/describe-http-error';
import { SERVER_ERROR } from './zod-validator';

/**
 * Puts a failed call's field errors (`{ error: { fields } }`) under the form's controls of the
 * same names, in the server's words, and marks them touched so they show. Returns the sentence
 * to show elsewhere when none went under a field: `notAnswered` when the failure is not an HTTP
 * answer, else the usual description of the answer; null when every message found its field.
 */
export function showServerFieldErrors(error: unknown, form: FormGroup, notAnswered: string): string | null {
  if (!(error instanceof HttpErrorResponse)) return notAnswered;
  let isShownAtField = false;
  for (const [name, message] of Object.entries(apiErrorDetails(error)?.fields ?? {})) {
    const control = form.get(name);
    if (!control) continue;
    control.setErrors({ ...control.errors, [SERVER_ERROR]: message });
    control.markAsTouched();
    isShownAtField = true;
  }
  return isShownAtField ? null : describeHttpError(error);
}
