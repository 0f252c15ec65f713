/**
 * The names and Secure flag of Tidemark's two cookies. Served over plain HTTP (a local demo),
 * they are `tm.sid` and `XSRF-TOKEN`, Secure whenever the request came over HTTPS. An installation
 * that is reached over HTTPS only (APP_URL starts with https://, see server/main.ts) gives both the
 * `__Host-` prefix (RFC 6265bis §4.1.3.2; OWASP ASVS 5.0 §3.3.3): the browser then keeps them only
 * if they are Secure, for path `/` and without a Domain, so no other host or path can set or
 * shadow them.
 */
export interface CookieNames {
  session: string;
  xsrf: string;
  /** Whether both cookies are always Secure (and prefixed). */
  isHttpsOnly: boolean;
}

/** Cookie names for an installation reached over plain HTTP or over HTTPS only. */
export function cookieNames(isHttpsOnly: boolean): CookieNames {
  return isHttpsOnly ? { session: '__Host-tm.sid', xsrf: '__Host-XSRF-TOKEN', isHttpsOnly } : { session: 'tm.sid', xsrf: 'XSRF-TOKEN', isHttpsOnly };
}
