import type { Request } from 'express';
import { HttpError } from '../http-error';

/** The signed-in person (requireAuth or requireRole ran first; this narrows the type without a cast). */
export function signedInUser(req: Request): Express.User {
  if (!req.user) throw new HttpError(401, 'unauthenticated', 'Sign in to continue.');
  return req.user;
}
