/** Machine-readable error codes the API answers with. */
export type ApiErrorCode =
  | 'validation'
  | 'unauthenticated'
  /** Password accepted; a one-time or recovery code is still due (401). */
  | 'second_factor_pending'
  /** The role must set up one-time codes before anything else (403). */
  | 'second_factor_enrolment_required'
  /** The one-time or recovery code was wrong, used already, or expired (401). */
  | 'second_factor_invalid'
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
