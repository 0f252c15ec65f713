import { HttpContext, HttpContextToken } from '@angular/common/http';

/**
 * Marks a request whose caller presents its own error messages (inline, beside the form),
 * so the global error notice stays quiet and nothing is reported twice.
 */
export const SHOWS_OWN_ERRORS = new HttpContextToken<boolean>(() => false);

/** Request context for a call whose errors the caller shows itself. */
export function showsOwnErrors(): HttpContext {
  return new HttpContext().set(SHOWS_OWN_ERRORS, true);
}
