import type { ApiErrorCode } from '@tidemark/shared';
import type { RawAnswer } from './raw-client';

/** Every code of `ApiErrorCode` (the `satisfies` keeps the list in step with the shared type). */
const ERROR_CODES = {
  validation: true,
  unauthenticated: true,
  forbidden: true,
  csrf: true,
  not_found: true,
  conflict: true,
  rate_limited: true,
  payload_too_large: true,
  unsupported_media_type: true,
  unavailable: true,
  internal: true,
  second_factor_pending: true,
  second_factor_enrolment_required: true,
  second_factor_invalid: true,
} as const satisfies Record<ApiErrorCode, true>;

const ERROR_KEYS = new Set(['code', 'message', 'fields', 'details']);

/** Signs of a leaked stack trace or server file path (V8 frame lines, source locations, the checkout path). */
function leakIn(text: string): string | undefined {
  if (/\bat (?:async )?[\w$.<>]+ \(/.test(text) || /\\n\s+at /.test(text)) return 'a stack frame';
  if (/\.(?:ts|js|mjs|cjs):\d+/.test(text)) return 'a source location';
  if (text.includes(process.cwd()) || text.includes('node_modules') || text.includes('file://')) return 'a server file path';
  return undefined;
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/**
 * What is wrong with an answer to malformed input, or undefined when it is right: a status in
 * `allowed` (always 4xx), a JSON body `{ error: { code, message, fields?, details? } }` with a
 * known code and a non-empty message, and no stack trace or file path anywhere in it.
 */
export function errorAnswerProblem(answer: RawAnswer, allowed: ReadonlySet<number>): string | undefined {
  if (answer.status < 400 || answer.status > 499) return `status ${answer.status}, expected 4xx`;
  if (!allowed.has(answer.status)) return `status ${answer.status}, expected one of ${[...allowed].join('/')}`;
  if (!answer.contentType.startsWith('application/json')) return `content type "${answer.contentType}", expected JSON`;
  const body = answer.json;
  if (!isRecord(body) || Object.keys(body).length !== 1 || !isRecord(body.error)) return 'body is not { error: {...} }';
  const { error } = body;
  if (typeof error.code !== 'string' || !(error.code in ERROR_CODES)) return `unknown error code ${JSON.stringify(error.code)}`;
  if (typeof error.message !== 'string' || error.message.trim() === '') return 'error without a message';
  const extra = Object.keys(error).filter((key) => !ERROR_KEYS.has(key));
  if (extra.length) return `unexpected error keys ${extra.join(', ')}`;
  const leak = leakIn(answer.text);
  return leak ? `the answer carries ${leak}` : undefined;
}

/** For the few routes that ignore their body by design: 2xx is fine, 5xx never. */
export function acceptedAnswerProblem(answer: RawAnswer, allowed: ReadonlySet<number>): string | undefined {
  if (answer.status >= 200 && answer.status < 300) {
    const leak = leakIn(answer.text);
    return leak ? `the answer carries ${leak}` : undefined;
  }
  return errorAnswerProblem(answer, allowed);
}
