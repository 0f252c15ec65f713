import { inject } from '@angular/core';
import { CanActivateChildFn, Router } from '@angular/router';
import { ACCOUNT_SECURITY_PATH } from './account-security-path';
import { AuthSession } from './auth-session';

/**
 * Sends someone whose role must use one-time codes, and who has none yet, to the Sign-in
 * protection page: the server answers nothing else for them until they set codes up.
 */
export const enrolmentGuard: CanActivateChildFn = (_route, state) => {
  if (inject(AuthSession).secondFactor() !== 'enrolment-required') {
    return true;
  }
  const isThere = state.url === ACCOUNT_SECURITY_PATH || state.url.startsWith(`${ACCOUNT_SECURITY_PATH}?`);
  return isThere ? true : inject(Router).parseUrl(ACCOUNT_SECURITY_PATH);
};
