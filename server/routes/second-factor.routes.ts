import { Router, type Request, type Response } from 'express';
import { rateLimit } from 'express-rate-limit';
import {
  oneTimeCodeRequestSchema,
  secondFactorVerifySchema,
  type EnrolmentConfirmation,
  type RecoveryCodesResponse,
  type SessionResponse,
} from '@tidemark/shared';
import type { CsrfProtection } from '../auth/csrf';
import { HttpError } from '../http-error';
import { logSecondFactorAccepted, logSecondFactorChanged, logSecondFactorRateLimited, logSecondFactorRefused, type CodeMethod } from '../logging/security-events';
import { requireAuth } from '../middleware/require-role';
import { validateBody } from '../middleware/validate';
import type { SecondFactorService } from '../services/second-factor.service';
import type { LoginLimits } from './auth.routes';
import { signedInUser } from './signed-in-user';
import { sessionUser } from './session-user';

/**
 * `/api/auth/second-factor`: the second sign-in step, setting up one-time codes, new recovery
 * codes and switching codes off, for the signed-in person themselves. Which of these a session
 * may reach in each state is decided by auth/second-factor-gate.ts.
 */
export function secondFactorRoutes(secondFactors: SecondFactorService, csrf: CsrfProtection, limits: LoginLimits): Router {
  const router = Router();
  // Wrong codes count against the person (not the address): whoever tries already has the
  // password, so spreading guesses over many addresses must not buy more of them.
  const codeAttempts = rateLimit({
    windowMs: limits.windowMs,
    limit: limits.perAccount,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    skipSuccessfulRequests: true,
    keyGenerator: (req) => `second-factor|${req.user?.id ?? 0}`,
    handler: (req: Request, res: Response) => {
      logSecondFactorRateLimited(req, req.user?.id);
      const minutes = Math.ceil(limits.windowMs / 60_000);
      res.status(429).json({ error: { code: 'rate_limited', message: `Too many wrong codes. Try again in up to ${minutes} minutes.` } });
    },
  });
  router.use(requireAuth);

  router.post('/verify', codeAttempts, validateBody(secondFactorVerifySchema), async (req, res) => {
    const user = signedInUser(req);
    if ((await secondFactors.stateFor(user, req.session.secondFactorVerifiedFor)) !== 'pending') {
      throw HttpError.conflict('This session is not waiting for a code.');
    }
    const method: CodeMethod = req.body.method;
    const verifiedFor = await refusalLogged(req, user.id, method, secondFactors.verify(user.id, req.body));
    await renewSession(req, res, csrf, user, verifiedFor);
    logSecondFactorAccepted(req, user.id, method);
    const body: SessionResponse = { user: sessionUser(user), secondFactor: 'verified' };
    res.json(body);
  });

  router.get('/', async (req, res) => {
    res.json(await secondFactors.status(signedInUser(req)));
  });

  router.post('/enrolment', async (req, res) => {
    // The secret is in the answer: no cache may keep it.
    res.set('Cache-Control', 'no-store');
    res.json(await secondFactors.startEnrolment(signedInUser(req)));
  });

  router.post('/enrolment/confirm', codeAttempts, validateBody(oneTimeCodeRequestSchema), async (req, res) => {
    const user = signedInUser(req);
    const { recoveryCodes, enabledAt } = await refusalLogged(req, user.id, 'one-time-code', secondFactors.confirmEnrolment(user, req.body.code));
    // The session gains a higher assurance level: give it a new id (session fixation defence).
    await renewSession(req, res, csrf, user, enabledAt);
    logSecondFactorChanged(req, user.id, 'enabled');
    const body: EnrolmentConfirmation = { recoveryCodes, session: { user: sessionUser(user), secondFactor: 'verified' } };
    res.set('Cache-Control', 'no-store');
    res.json(body);
  });

  router.post('/recovery-codes', codeAttempts, validateBody(oneTimeCodeRequestSchema), async (req, res) => {
    const user = signedInUser(req);
    const body: RecoveryCodesResponse = { recoveryCodes: await refusalLogged(req, user.id, 'one-time-code', secondFactors.regenerateRecoveryCodes(user, req.body.code)) };
    logSecondFactorChanged(req, user.id, 'recovery_codes_renewed');
    res.set('Cache-Control', 'no-store');
    res.json(body);
  });

  router.post('/disable', codeAttempts, validateBody(oneTimeCodeRequestSchema), async (req, res) => {
    const user = signedInUser(req);
    await refusalLogged(req, user.id, 'one-time-code', secondFactors.disable(user, req.body.code, req.sessionID));
    delete req.session.secondFactorVerifiedFor;
    logSecondFactorChanged(req, user.id, 'disabled');
    const body: SessionResponse = { user: sessionUser(user), secondFactor: await secondFactors.stateFor(user, undefined) };
    res.json(body);
  });

  return router;
}

/**
 * Gives the session a new id (passport ≥ 0.6 `req.login` regenerates it), keeps the original
 * sign-in time for the absolute limit and the device it came from, records the verified set-up and reissues the CSRF token.
 */
async function renewSession(req: Request, res: Response, csrf: CsrfProtection, user: Express.User, verifiedFor: number): Promise<void> {
  const { signedInAt = Date.now(), device } = req.session;
  await new Promise<void>((resolve, reject) => req.login(user, (error: unknown) => (error ? reject(error) : resolve())));
  req.session.signedInAt = signedInAt;
  req.session.device = device;
  req.session.secondFactorVerifiedFor = verifiedFor;
  csrf.reissue(req, res);
}

/** Passes `work` through, first logging a wrong or used code (the refusal then reaches the error handler as before). */
function refusalLogged<T>(req: Request, userId: number, method: CodeMethod, work: Promise<T>): Promise<T> {
  return work.catch((error: unknown) => {
    if (error instanceof HttpError && error.code === 'second_factor_invalid') logSecondFactorRefused(req, userId, method);
    throw error;
  });
}
