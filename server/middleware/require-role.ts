import type { RequestHandler } from 'express';
import type { Role } from '@tidemark/shared';
import { HttpError } from '../http-error';

/** 401 when nobody is signed in. */
export const requireAuth: RequestHandler = (req, _res, next) => {
  next(req.user ? undefined : new HttpError(401, 'unauthenticated', 'Sign in to continue.'));
};

/** 401 when nobody is signed in, 403 when the signed-in role is not one of `roles`. */
export function requireRole(...roles: Role[]): RequestHandler {
  const allowed = new Set<Role>(roles);
  return (req, _res, next) => {
    if (!req.user) return next(new HttpError(401, 'unauthenticated', 'Sign in to continue.'));
    if (!allowed.has(req.user.role)) return next(HttpError.forbidden());
    next();
  };
}
