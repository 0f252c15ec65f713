import { DOCUMENT } from '@angular/common';
import { HttpXsrfTokenExtractor } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';

/** The server's anti-forgery cookie: `__Host-XSRF-TOKEN` when reached over HTTPS only, else `XSRF-TOKEN` (server/auth/cookie-names.ts). */
export const XSRF_COOKIE_NAMES = ['__Host-XSRF-TOKEN', 'XSRF-TOKEN'] as const;

/**
 * Reads the anti-forgery token for Angular's XSRF interceptor from whichever of the server's
 * two cookie names is present, the `__Host-` one first, so one client build serves a plain-HTTP
 * demo and an HTTPS-only installation alike.
 */
@Injectable()
export class XsrfCookieExtractor extends HttpXsrfTokenExtractor {
  private readonly document = inject(DOCUMENT);

  override getToken(): string | null {
    const cookies = new Map<string, string>();
    for (const part of this.document.cookie.split(';')) {
      const at = part.indexOf('=');
      if (at > 0) cookies.set(part.slice(0, at).trim(), part.slice(at + 1).trim());
    }
    for (const name of XSRF_COOKIE_NAMES) {
      const value = cookies.get(name);
      if (value) return decodeURIComponent(value);
    }
    return null;
  }
}
