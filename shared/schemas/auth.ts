import * as z from 'zod';
import { ROLES } from '../types/role';
import type { SecondFactorState } from '../types/second-factor';

/** Sign-in request body. Length caps stop oversized input before any hashing. */
export const loginSchema = z.object({
  email: z.string().trim().min(1, 'Enter your e-mail address.').max(254).email('Enter a valid e-mail address.'),
  password: z.string().min(1, 'Enter your password.').max(256),
});
export type LoginRequest = z.infer<typeof loginSchema>;

/** The signed-in person as the API returns them. */
export const sessionUserSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  displayName: z.string(),
  role: z.enum(ROLES),
});
export type SessionUser = z.infer<typeof sessionUserSchema>;

/** Response of `POST /api/auth/login`, `GET /api/auth/me` and the second-factor steps. */
export interface SessionResponse {
  user: SessionUser;
  /** Where the session stands with the second factor; only `none` and `verified` open the app. */
  secondFactor: SecondFactorState;
}

/**
 * One of the signed-in person's own sessions, as `GET /api/auth/sessions` lists them. `id` is
 * an opaque handle derived from the session id with a keyed hash, never the session id itself.
 */
export interface OwnSession {
  id: string;
  /** Browser and system in a few words ("Firefox on Linux"). */
  device: string;
  /** ISO 8601; null for a session from before devices were recorded. */
  signedInAt: string | null;
  /** ISO 8601, to within a minute (the stored idle expiry moves at most once a minute). */
  lastActiveAt: string;
  /** The session this request came from. */
  isCurrent: boolean;
}

/** The handle of {@link OwnSession} in a route (`DELETE /api/auth/sessions/:id`). */
export const ownSessionHandleSchema = z.object({
  id: z.string().regex(/^[A-Za-z0-9_-]{22}$/, 'No such session.'),
});

/** Answer of the routes that end sessions. */
export interface EndedSessions {
  endedSessions: number;
}
