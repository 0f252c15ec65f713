import type { ErrorRequestHandler } from 'express';
import type { ApiErrorBody, ApiErrorCode } from '@tidemark/shared';
import { HttpError } from '../http-error';
import { isHiddenRefusal, logAccessRefused, logInputRefused } from '../logging/security-events';
import { isUniqueViolation } from '../services/unique-violation';

interface HttpishError {
  status?: number;
  statusCode?: number;
  type?: string;
  code?: string;
}

function isHttpish(error: unknown): error is HttpishError {
  return typeof error === 'object' && error !== null;
}

/** Maps errors thrown by body parsers and other middleware to our JSON error shape. */
function toHttpError(error: unknown): HttpError | undefined {
  if (error instanceof HttpError) return error;
  // Two requests saved the same thing at once and the database's unique index stopped the second.
  if (isUniqueViolation(error)) return HttpError.conflict('Someone saved the same record at the same moment. Reload to see it, then try again.');
  if (!isHttpish(error)) return undefined;
  switch (error.type) {
    case 'entity.parse.failed':
      return new HttpError(400, 'validation', 'The request body is not valid JSON.');
    case 'entity.too.large':
      return new HttpError(413, 'payload_too_large', 'The request is too large.');
    case 'encoding.unsupported':
    case 'charset.unsupported':
      return new HttpError(415, 'unsupported_media_type', 'The request encoding is not supported.');
  }
  const status = error.status ?? error.statusCode;
  if (typeof status === 'number' && status >= 400 && status < 500) {
    const codes: Record<number, ApiErrorCode> = { 401: 'unauthenticated', 403: 'forbidden', 404: 'not_found', 413: 'payload_too_large', 415: 'unsupported_media_type' };
    return new HttpError(status, codes[status] ?? 'validation', 'The request could not be processed.');
  }
  return undefined;
}

/** The one error handler, registered last: JSON `{ error: { code, message } }`, never a stack trace. */
export const errorHandler: ErrorRequestHandler = (error: unknown, req, res, _next) => {
  const known = toHttpError(error);
  if (!known) req.log?.error({ err: error }, 'unhandled error');
  const status = known?.status ?? 500;
  // Every refusal reaches this one place (ASVS 5.0 §16.3.2; 400s for §16.3.3), unless its route logged a more specific event.
  if (known && (status === 401 || status === 403)) logAccessRefused(req, status, known.code);
  else if (known && status === 404 && isHiddenRefusal(error)) logAccessRefused(req, status, known.code);
  else if (known && status === 400) logInputRefused(req, known.code, Object.keys(known.fields ?? {}));
  const body: ApiErrorBody = {
    error: {
      code: known?.code ?? 'internal',
      message: known?.message ?? 'Something went wrong on our side. The error has been logged.',
      ...(known?.fields ? { fields: known.fields } : {}),
      ...(known?.details ? { details: known.details } : {}),
    },
  };
  if (res.headersSent) return;
  res.status(status).json(body);
};
