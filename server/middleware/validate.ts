import type { Request, RequestHandler } from 'express';
import type { z } from 'zod';
import { HttpError } from '../http-error';

/** Turns zod issues into `{ "field.path": "message" }` (first message per field). */
export function fieldErrors(error: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_';
    fields[key] ??= issue.message;
  }
  return fields;
}

/** Parses a value with a schema or throws a 400 with field errors. Unknown keys are stripped by zod objects. */
export function parseOrThrow<T extends z.ZodType>(schema: T, value: unknown): z.output<T> {
  const result = schema.safeParse(value);
  if (!result.success) throw HttpError.badRequest('Some fields need attention.', fieldErrors(result.error));
  return result.data;
}

/** Whether the request carries body bytes: a non-zero Content-Length or a chunked transfer (RFC 9112 §6). */
function hasBody(req: Request): boolean {
  const length = req.headers['content-length'];
  return req.headers['transfer-encoding'] !== undefined || (length !== undefined && length !== '0');
}

/**
 * Validates `req.body` with a shared zod schema and replaces it with the parsed value. A body
 * sent as anything but JSON is a 415: the JSON parser skips it, and reading it as `{}` would
 * run the route with defaults the sender never chose.
 */
export function validateBody(schema: z.ZodType): RequestHandler {
  return (req, _res, next) => {
    if (hasBody(req) && !req.is('application/json')) {
      next(new HttpError(415, 'unsupported_media_type', 'Send the request body as JSON (Content-Type: application/json).'));
      return;
    }
    try {
      req.body = parseOrThrow(schema, req.body ?? {});
      next();
    } catch (error) {
      // Hand the 400 to the error handler like any other error.
      next(error);
    }
  };
}
