import type { Role } from '@tidemark/shared';

declare module 'express-session' {
  interface SessionData {
    /** Epoch ms of sign-in: the absolute 8-hour limit counts from here. */
    signedInAt?: number;
    /** Set when a CSRF token is issued, so an anonymous session is kept and the token stays bound. */
    csrfIssuedAt?: number;
    /** `enabledAt` (epoch ms) of the one-time-code set-up whose code was checked in this session. */
    secondFactorVerifiedFor?: number;
    /** The browser and system it was signed in from, in a few words (own-sessions list), e.g. "Firefox on Linux". */
    device?: string;
    passport?: { user?: number };
  }
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    /** The signed-in person as passport puts it on `req.user`. */
    interface User {
      id: number;
      email: string;
      displayName: string;
      role: Role;
    }

    interface Request {
      /**
       * When the signed-in user's one-time codes were switched on (epoch ms; null when off), read
       * together with the user as the session was loaded (passport-setup.ts), so that the
       * second-factor gate needs no query of its own. Undefined when no user was loaded.
       */
      secondFactorEnabledAt?: number | null;
    }
  }
}

export {};
