import { HttpErrorResponse } from '@angular/common/http';
import { apiErrorDetails } from '../../core/http/api-error-details';
import { describeHttpError } from '../../core/http/describe-http-error';

/** What a failed save of a recall means for the person entering it. */
export type VisitSaveFailure =
  /** A REF→GM moved more than 3 mm: check the reference point, then resend confirmed. */
  | { kind: 'needs-confirmation'; message: string; fields: Record<string, string> }
  /** Someone else saved this recall first (a newer version, or the same interval recorded). */
  | { kind: 'stale'; message: string; currentVersion: number | null }
  /** Field errors to show beside their fields. */
  | { kind: 'fields'; message: string; fields: Record<string, string> }
  /** Anything else, as one sentence. */
  | { kind: 'other'; message: string };

/** Reads `error.details` of our error body; `apiErrorDetails` covers code, message and fields. */
function errorFacts(response: HttpErrorResponse): Record<string, unknown> {
  const body: unknown = response.error;
  if (typeof body !== 'object' || body === null || !('error' in body)) {
    return {};
  }
  const error: unknown = body.error;
  if (typeof error !== 'object' || error === null || !('details' in error)) {
    return {};
  }
  const details: unknown = error.details;
  return typeof details === 'object' && details !== null ? Object.fromEntries(Object.entries(details)) : {};
}

/** Sorts a failed `POST …/visits` or `PATCH /api/visits/:id` into what the page does next. */
export function readVisitSaveFailure(error: unknown): VisitSaveFailure {
  if (!(error instanceof HttpErrorResponse)) {
    return { kind: 'other', message: 'The recall could not be saved. Try again.' };
  }
  const details = apiErrorDetails(error);
  const facts = errorFacts(error);
  if (error.status === 400 && facts['needsConfirmation'] === true) {
    return { kind: 'needs-confirmation', message: details?.message ?? 'Check the reference point and confirm.', fields: details?.fields ?? {} };
  }
  if (error.status === 409) {
    const version = facts['currentVersion'];
    return {
      kind: 'stale',
      message: details?.message ?? 'Someone changed this recall in the meantime.',
      currentVersion: typeof version === 'number' ? version : null,
    };
  }
  if (error.status === 400 && details?.fields && Object.keys(details.fields).length) {
    return { kind: 'fields', message: details.message, fields: details.fields };
  }
  return { kind: 'other', message: describeHttpError(error) };
}
