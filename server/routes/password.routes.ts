import { Router, type Request, type Response } from 'express';
import { rateLimit } from 'express-rate-limit';
import { passwordChangeSchema, type PasswordChange, type PasswordChangeResult } from '@tidemark/shared';
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
    handler: (_req: Request, res: Response) => {
      const minutes = Math.ceil(limits.windowMs / 60_000);
      res.status(429).json({ error: { code: 'rate_limited', message: `Too many refused password changes. Try again in up to ${minutes} minutes.` } });
    },
  });

  router.post('/', requireAuth, perMember, validateBody(passwordChangeSchema), async (req, res) => {
    const { user, endedSessions } = await users.changeOwnPassword((req.user as Express.User).id, req.body as PasswordChange, req.sessionID);
    await mail.queuePasswordChangedNotice(user, endedSessions);
    const body: PasswordChangeResult = { endedSessions };
    res.json(body);
  });

  return router;
}
