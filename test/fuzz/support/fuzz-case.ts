import fc from 'fast-check';
import type { Actor } from './fuzz-world';
import type { Credentials, RawRequest } from './raw-client';

/** What makes a case invalid (each case has at least one such reason). */
export type FuzzMode =
  | 'body'
  | 'refused'
  | 'param'
  | 'missing-id'
  | 'content-type'
  | 'encoding'
  | 'malformed-json'
  | 'oversize'
  | 'csrf'
  | 'actor'
  | 'ignored-body'
  | 'form-fields'
  | 'file'
  | 'multipart-framing';

/** How the CSRF token travels (OWASP CSRF Prevention Cheat Sheet: signed double submit + origin check). */
export type CsrfVariant = 'valid' | 'missing' | 'garbage' | 'cross-site-origin' | 'cross-site-fetch';

/** Every 4xx status: the property for cases where only "a client error" is certain. */
export const ANY_4XX: ReadonlySet<number> = new Set(Array.from({ length: 100 }, (_, index) => 400 + index));

const PREVIEW_CHARS = 400;

/** The token with its last four characters changed (never equal to the original). */
function tampered(token: string): string {
  const tail = token.slice(-4) === 'AAAA' ? 'BBBB' : 'AAAA';
  return `${token.slice(0, -4)}${tail}`;
}

/** One generated request with what its answer must be. fast-check prints it through `toStringMethod`. */
export class FuzzCase {
  constructor(
    readonly mode: FuzzMode,
    readonly request: RawRequest,
    /** Statuses the answer may have (all 4xx). */
    readonly allowed: ReadonlySet<number>,
    readonly actor: Actor,
    readonly csrf: CsrfVariant = 'valid',
    /** True where a 2xx is right (a body the route ignores by design, an import checked later). */
    readonly allows2xx = false,
  ) {}

  /** The wire request with the actor's cookies and the CSRF header as the variant says. */
  withCredentials(credentials: Credentials): RawRequest {
    const headers: Record<string, string> = { ...this.request.headers };
    if (credentials.cookie) headers['cookie'] = credentials.cookie;
    if (this.csrf !== 'missing') headers['x-xsrf-token'] = this.csrf === 'garbage' ? tampered(credentials.xsrf) : credentials.xsrf;
    if (this.csrf === 'cross-site-origin') headers['origin'] = 'https://attacker.example.org';
    if (this.csrf === 'cross-site-fetch') headers['sec-fetch-site'] = 'cross-site';
    return { ...this.request, headers };
  }

  /** A short, printable description (bodies can be 200 kB). */
  [fc.toStringMethod](): string {
    const body = this.request.body?.toString('utf8') ?? '';
    const preview = body.length > PREVIEW_CHARS ? `${JSON.stringify(body.slice(0, PREVIEW_CHARS))}… (${body.length} chars)` : JSON.stringify(body);
    return `${this.mode} as ${this.actor}${this.csrf === 'valid' ? '' : ` (csrf ${this.csrf})`}: ${this.request.method} ${this.request.path} ${JSON.stringify(this.request.headers)} body ${preview}`;
  }
}
