import { HttpErrorResponse } from '@angular/common/http';
import { apiErrorDetails } from './api-error-details';

/**
 * Turns a failed request into one sentence a person can act on.
 * The server's own message is used where it is the most specific thing we have
 * (conflicts, rate limits, validation); otherwise a sentence of ours per status.
 */
export function describeHttpError(response: HttpErrorResponse): string {
  const details = apiErrorDetails(response);
  const status = response.status;

  if (status === 0) {
    return "Tidemark can't reach the server. Check the connection and try again.";
  }
  if (status === 401) {
    return 'Your session has ended. Sign in again to continue.';
  }
  if (status === 403) {
    return details?.code === 'csrf'
      ? 'This page was open too long to save safely. Reload it and try again.'
      : "Your role doesn't allow this action. If you need it, ask the audit lead or an administrator.";
  }
  if (status === 404) {
    return 'That record could not be found. It may have been removed; reload the page to see what is there now.';
  }
  if (status === 413) {
    return 'That file is too large to upload. Choose a smaller one: the size limit is given beside the button.';
  }
  if (status === 415) {
    return "That kind of file isn't accepted here. Choose one of the kinds listed beside the button.";
  }
  if (status >= 500) {
    return 'Something went wrong on the server. Try again; if it keeps happening, tell your administrator.';
  }
  if (details?.message) {
    return details.message;
  }
  if (status === 409) {
    return 'Someone changed this in the meantime. Reload and try again.';
  }
  if (status === 429) {
    return 'Too many attempts. Wait a moment and try again.';
  }
  return 'Some entries need correcting before this can be saved.';
}
