/** Machine-readable error codes the API answers with. */
export type ApiErrorCode =
  | 'validation'
  | 'unauthenticated'
  | 'forbidden'
  | 'csrf'
  | 'not_found'
  | 'conflict'
  | 'rate_limited'
  | 'payload_too_large'
  | 'unsupported_media_type'
  | 'unavailable'
  | 'internal';

/** Body of every error response: `{ error: { code, message, fields? } }`. */
export interface ApiErrorBody {
  error: {
    code: ApiErrorCode;
    message: string;
    /** Field path (dot-separated) → message, for validation errors. */
    fields?: Record<string, string>;
    /** Extra facts, e.g. `{ currentVersion }` with a 409. */
    details?: Record<string, unknown>;
  };
}
