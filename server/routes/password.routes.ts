import { Router, type Request, type Response } from 'express';
import { rateLimit } from 'express-rate-limit';
import { passwordChangeSchema, type PasswordChange, type PasswordChangeResult } from '@tidemark/shared';
import { HttpError } from '../http-error';
import { logPasswordChanged, logPasswordChangeRateLimited, logPasswordChangeRefused } from '../logging/security-events';
import { requireAuth } from '../middleware/require-role';
import { validateBody } from '../middleware/validate';
import type { MailService } from '../services/mail.service';
import type { UserService } from '../services/user.service';

/** Refused password changes allowed per member within the window (a stolen session must not guess the password). */
export interface PasswordChangeLimits {
  perMember: number;
  windowMs: number;
}

export const DEFAULT_PASSWORD_CHANGE_LIMITS: PasswordChangeLimits = { perMember: 5, windowMs: 15 * 60 * 1000 };

/**
 * `POST /api/auth/password`: a signed-in member changes their own password (OWASP ASVS 5.0
 * §6.2.2, §6.2.3). Their other sessions end, this one stays signed in, and a notice goes to their
 * e-mail address. Refused attempts (wrong current password, bad new one) count against a
 * per-member limit, so a borrowed session cannot be used to guess the password.
 */
export function passwordRoutes(users: UserService, mail: MailService, limits: PasswordChangeLimits = DEFAULT_PASSWORD_CHANGE_LIMITS): Router {
  const router = Router();
  const perMember = rateLimit({
    windowMs: limits.windowMs,
    limit: limits.perMember,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    skipSuccessfulRequests: true,
    keyGenerator: (req) => `member:${(req.user as Express.User).id}`,
    handler: (req: Request, res: Response) => {
      logPasswordChangeRateLimited(req, req.user?.id);
      const minutes = Math.ceil(limits.windowMs / 60_000);
      res.status(429).json({ error: { code: 'rate_limited', message: `Too many refused password changes. Try again in up to ${minutes} minutes.` } });
    },
  });

  router.post('/', requireAuth, perMember, validateBody(passwordChangeSchema), async (req, res) => {
    const userId = (req.user as Express.User).id;
    const { user, endedSessions } = await users.changeOwnPassword(userId, req.body as PasswordChange, req.sessionID).catch((error: unknown) => {
      // A wrong current password is a failed authentication (ASVS 5.0 §16.3.1); the refusal still goes on to the error handler.
      const refusal = error instanceof HttpError ? refusalOf(error) : undefined;
      if (refusal) logPasswordChangeRefused(req, userId, refusal);
      throw error;
    });
    logPasswordChanged(req, userId, endedSessions);
    await mail.queuePasswordChangedNotice(user, endedSessions);
    const body: PasswordChangeResult = { endedSessions };
    res.json(body);
  });

  return router;
}

/** Which refusal of UserService.changeOwnPassword an error is, by the field it names. */
function refusalOf(error: HttpError): 'wrong_current_password' | 'common_password' | undefined {
  if (error.fields?.['currentPassword']) return 'wrong_current_password';
  if (error.fields?.['newPassword']) return 'common_password';
  return undefined;
}
