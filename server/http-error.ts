import type { ApiErrorCode } from '@tidemark/shared';

/** An error that maps to one HTTP answer. Thrown by services, turned into JSON by the error handler. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: ApiErrorCode,
    message: string,
    readonly fields?: Record<string, string>,
    /** Extra machine-readable facts, e.g. `{ currentVersion }` on a 409. */
    readonly details?: Record<string, unknown>,
  ) {
    super(message);
    this.name = 'HttpError';
  }

  static badRequest(message: string, fields?: Record<string, string>): HttpError {
    return new HttpError(400, 'validation', message, fields);
  }

  static notFound(what = 'The item'): HttpError {
    return new HttpError(404, 'not_found', `${what} was not found.`);
  }

  static forbidden(message = 'Your role does not allow this.'): HttpError {
    return new HttpError(403, 'forbidden', message);
  }

  static conflict(message: string): HttpError {
    return new HttpError(409, 'conflict', message);
  }
}
