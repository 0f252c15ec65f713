import { Router, type NextFunction, type Request, type Response } from 'express';
import { rateLimit, ipKeyGenerator } from 'express-rate-limit';
import { loginSchema, type SessionResponse, type SignInOptions } from '@tidemark/shared';
import type { CookieNames } from '../auth/cookie-names';
import type { CsrfProtection } from '../auth/csrf';
import { SIGN_IN_FAILED_MESSAGE, type PassportInstance } from '../auth/passport-setup';
import { HttpError } from '../http-error';
import { logSignInRateLimited, logSignOut } from '../logging/security-events';
import { requireAuth } from '../middleware/require-role';
import { validateBody } from '../middleware/validate';
import type { SecondFactorService } from '../services/second-factor.service';
import { describeDevice } from '../auth/device-description';
import { sessionUser } from './session-user';

/** Limits on failed sign-ins. */
export interface LoginLimits {
  /** Failures allowed per account and address within the window. */
  perAccount: number;
  /** Failures allowed per address (any account) within the window. */
  perAddress: number;
  windowMs: number;
}

export const DEFAULT_LOGIN_LIMITS: LoginLimits = { perAccount: 5, perAddress: 50, windowMs: 15 * 60 * 1000 };

function tooManyAttempts(windowMs: number, limit: 'address' | 'account') {
  return (req: Request, res: Response) => {
    logSignInRateLimited(req, limit);
    const minutes = Math.ceil(windowMs / 60_000);
    res.status(429).json({
      error: { code: 'rate_limited', message: `Too many failed sign-ins. Try again in up to ${minutes} minutes.` },
    });
  };
}

function emailKey(req: Request): string {
  const email: unknown = req.body?.email;
  return typeof email === 'string' ? email.trim().toLowerCase().slice(0, 254) : '';
}

/** Sign-in (password step), sign-out, the current session and what the sign-in page must know. */
export function authRoutes(passport: PassportInstance, csrf: CsrfProtection, limits: LoginLimits, secondFactors: SecondFactorService, cookies: CookieNames): Router {
  const router = Router();
  const common = { windowMs: limits.windowMs, standardHeaders: 'draft-7' as const, legacyHeaders: false, skipSuccessfulRequests: true };
  const perAddress = rateLimit({ ...common, limit: limits.perAddress, keyGenerator: (req) => ipKeyGenerator(req.ip ?? ''), handler: tooManyAttempts(limits.windowMs, 'address') });
  const perAccount = rateLimit({
    ...common,
    limit: limits.perAccount,
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${emailKey(req)}`,
    handler: tooManyAttempts(limits.windowMs, 'account'),
  });

  router.post('/login', perAddress, perAccount, validateBody(loginSchema), (req: Request, res: Response, next: NextFunction) => {
    passport.authenticate('local', { session: false }, (error: unknown, user: Express.User | false) => {
      if (error) return next(error);
      if (!user) return next(new HttpError(401, 'unauthenticated', SIGN_IN_FAILED_MESSAGE));
      // passport ≥ 0.6 regenerates the session here (fixation defence).
      req.login(user, (loginError) => {
        if (loginError) return next(loginError);
        req.session.signedInAt = Date.now();
        req.session.device = describeDevice(req.get('user-agent'));
        csrf.reissue(req, res);
        // With one-time codes on, the session is only "password checked" until the code comes (second-factor.routes.ts).
        secondFactors
          .stateFor(user, undefined)
          .then((secondFactor) => {
            const body: SessionResponse = { user: sessionUser(user), secondFactor };
            res.json(body);
          })
          .catch(next);
      });
    })(req, res, next);
  });

  router.get('/me', requireAuth, async (req, res) => {
    const user = req.user as Express.User;
    const body: SessionResponse = { user: sessionUser(user), secondFactor: await secondFactors.stateFor(user, req.session.secondFactorVerifiedFor) };
    res.json(body);
  });

  router.get('/sign-in-options', (_req, res) => {
    const body: SignInOptions = { secondFactorPolicy: secondFactors.policy };
    res.json(body);
  });

  router.post('/logout', (req, res, next) => {
    const userId = req.user?.id;
    req.logout((logoutError) => {
      if (logoutError) return next(logoutError);
      req.session.destroy((destroyError) => {
        if (destroyError) return next(destroyError);
        if (userId !== undefined) logSignOut(req, userId);
        // With the same attributes it was set with: a browser ignores a __Host- cookie's removal without Secure and path /.
        res.clearCookie(cookies.session, { path: '/', httpOnly: true, sameSite: 'lax', secure: cookies.isHttpsOnly || req.secure });
        res.status(204).end();
      });
    });
  });

  return router;
}

