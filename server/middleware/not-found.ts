import type { RequestHandler } from 'express';
import { HttpError } from '../http-error';

/** JSON 404 for any `/api` path no router answered. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new HttpError(404, 'not_found', `No API route for ${req.method} ${req.path}.`));
};
