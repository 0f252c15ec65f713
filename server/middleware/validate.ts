import type { RequestHandler } from 'express';
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

/** Validates `req.body` with a shared zod schema and replaces it with the parsed value. */
export function validateBody(schema: z.ZodType): RequestHandler {
  return (req, _res, next) => {
    try {
      req.body = parseOrThrow(schema, req.body ?? {});
      next();
    } catch (error) {
      // Hand the 400 to the error handler like any other error.
      next(error);
    }
  };
}
