import { HttpErrorResponse } from '@angular/common/http';

/**
 * The `error` part of an API error body (`ApiErrorBody` in `@tidemark/shared`).
 * `code` stays a plain string here: a newer server may send codes this client does not know yet.
 */
export interface ApiErrorDetails {
  code: string;
  message: string;
  fields?: Record<string, string>;
}

/**
 * Reads `{ error: { code, message, fields? } }` from a failed response.
 * Returns null for network failures and for bodies that are not ours (e.g. a proxy's HTML page).
 */
export function apiErrorDetails(response: HttpErrorResponse): ApiErrorDetails | null {
  const body: unknown = response.error;
  if (typeof body !== 'object' || body === null || !('error' in body)) {
    return null;
  }
  const details: unknown = body.error;
  if (typeof details !== 'object' || details === null) {
    return null;
  }
  if (!('message' in details) || typeof details.message !== 'string') {
    return null;
  }
  const code = 'code' in details && typeof details.code === 'string' ? details.code : 'internal';
  const fields = 'fields' in details ? readFields(details.fields) : undefined;
  return {
    code,
    message: details.message,
    ...(fields ? { fields } : {}),
  };
}

function readFields(value: unknown): Record<string, string> | undefined {
  if (typeof value !== 'object' || value === null) {
    return undefined;
  }
  const fields: Record<string, string> = {};
  for (const [path, message] of Object.entries(value)) {
    if (typeof message === 'string') {
      fields[path] = message;
    }
  }
  return fields;
}
