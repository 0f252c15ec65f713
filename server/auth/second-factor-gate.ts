import type { NextFunction, Request, RequestHandler, Response } from 'express';
import type { SecondFactorState } from '@tidemark/shared';
import { HttpError } from '../http-error';
import type { SecondFactorService } from '../services/second-factor.service';

/** How long a password-checked session may wait for its code before the password is asked again. */
export const PENDING_LIMIT_MS = 5 * 60 * 1000;

/** Calls open whatever the state: who am I, which policy applies, sign in again, sign out. */
const ALWAYS_OPEN = ['GET /auth/me', 'GET /auth/sign-in-options', 'POST /auth/login', 'POST /auth/logout'];
/** The only further call a session waiting for its code may make. */
const OPEN_WHILE_PENDING = new Set([...ALWAYS_OPEN, 'POST /auth/second-factor/verify']);
/** The further calls a session that must set up codes first may make. */
const OPEN_UNTIL_ENROLLED = new Set([
  ...ALWAYS_OPEN,
  'GET /auth/second-factor',
  'POST /auth/second-factor/enrolment',
  'POST /auth/second-factor/enrolment/confirm',
]);

/**
 * Keeps a signed-in session inside the second-factor step it is at (mounted on the `/api`
 * router before every resource router): while a code is pending every other call answers
 * 401 `second_factor_pending`; while the role still has to set up codes every other call
 * answers 403 `second_factor_enrolment_required`. Fail-closed: anything not listed is refused.
 */
export function secondFactorGate(secondFactors: SecondFactorService): RequestHandler {
  return (req: Request, _res: Response, next: NextFunction) => {
    if (!req.user) return next();
    const user = req.user;
    secondFactors
      // The set-up as read with the session's user a moment ago (passport-setup.ts): no second query.
      .stateFor(user, req.session.secondFactorVerifiedFor, req.secondFactorEnabledAt)
      .then((state) => refusal(req, state))
      .then((error) => {
        if (error !== 'expired') return next(error);
        // The code never came: drop the half-finished sign-in, so the password is asked again.
        req.session.regenerate((regenerateError) => next(regenerateError ?? new HttpError(401, 'unauthenticated', 'The sign-in took too long. Sign in again.')));
      })
      .catch(next);
  };
}

function refusal(req: Request, state: SecondFactorState): HttpError | 'expired' | undefined {
  const call = `${req.method === 'HEAD' ? 'GET' : req.method} ${req.path.replace(/\/+$/, '') || '/'}`;
  if (state === 'pending') {
    const signedInAt = req.session.signedInAt ?? 0;
    const isLeaving = call === 'POST /auth/login' || call === 'POST /auth/logout';
    if (Date.now() - signedInAt > PENDING_LIMIT_MS && !isLeaving) return 'expired';
    if (OPEN_WHILE_PENDING.has(call)) return undefined;
    return new HttpError(401, 'second_factor_pending', 'Enter the one-time code from your app to finish signing in.');
  }
  if (state === 'enrolment-required' && !OPEN_UNTIL_ENROLLED.has(call)) {
    return new HttpError(403, 'second_factor_enrolment_required', 'Your role needs one-time codes. Set them up on the Sign-in protection page first.');
  }
  return undefined;
}
