import type { NextFunction, Request, RequestHandler, Response } from 'express';
import { doubleCsrf } from 'csrf-csrf';
import { HttpError } from '../http-error';
import { cookieNames, type CookieNames } from './cookie-names';
import { logCsrfRefused } from '../logging/security-events';

/** The header Angular's HttpClient sends the token in (the cookie's name is in cookie-names.ts). */
export const XSRF_HEADER = 'x-xsrf-token';

const UNSAFE_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/** How many sessions' last valid cookie token {@link createCsrfProtection} remembers. */
export const VALID_COOKIE_MEMORY = 1024;

/** CSRF protection: a signed double-submit token bound to the session, plus an origin check. */
export interface CsrfProtection {
  /** Issues a token when the request lacks a valid one; refuses unsafe requests without one. */
  middleware: RequestHandler;
  /** Issues a fresh token after the session id changed (sign-in, sign-out). */
  reissue(req: Request, res: Response): void;
}

/** Builds the CSRF middleware (csrf-csrf signed double submit, OWASP CSRF Prevention Cheat Sheet). */
export function createCsrfProtection(secret: string, names: CookieNames = cookieNames(false)): CsrfProtection {
  const { generateCsrfToken, validateRequest } = doubleCsrf({
    getSecret: () => secret,
    getSessionIdentifier: (req) => req.sessionID,
    cookieName: names.xsrf,
    // Readable by the client script (that is the point of double submit); the session cookie stays HttpOnly.
    cookieOptions: { httpOnly: false, sameSite: 'lax', path: '/', secure: names.isHttpsOnly },
    getCsrfTokenFromRequest: (req) => req.headers[XSRF_HEADER] as string | undefined,
  });

  const issue = (req: Request, res: Response, overwrite: boolean): void => {
    req.session.csrfIssuedAt = Date.now();
    generateCsrfToken(req, res, { overwrite, cookieOptions: { httpOnly: false, sameSite: 'lax', path: '/', secure: names.isHttpsOnly || req.secure } });
  };

  /**
   * Session id → the cookie token last found valid for it. Whether a token is valid is a pure
   * function of the secret, the session id and the token (an HMAC, no expiry), so a token seen
   * valid for a session stays valid for it: safe requests then skip the HMAC and the probe. Only
   * tokens that passed the check get in (no one can fill it without the secret); at most
   * {@link VALID_COOKIE_MEMORY} sessions, the longest unseen dropped first.
   */
  const validCookies = new Map<string, string>();

  /** Validates the cookie on its own by probing with a request whose header repeats the cookie. */
  const hasValidCookie = (req: Request): boolean => {
    const cookie: unknown = req.cookies?.[names.xsrf];
    if (typeof cookie !== 'string' || cookie === '') return false;
    const sessionId = req.sessionID;
    const remembered = validCookies.get(sessionId);
    if (remembered === cookie) {
      // Re-inserted so that the Map's first key is always the longest unseen.
      validCookies.delete(sessionId);
      validCookies.set(sessionId, cookie);
      return true;
    }
    const probe = Object.create(req, { headers: { value: { ...req.headers, [XSRF_HEADER]: cookie } } }) as Request;
    if (!validateRequest(probe)) return false;
    validCookies.delete(sessionId);
    validCookies.set(sessionId, cookie);
    if (validCookies.size > VALID_COOKIE_MEMORY) {
      const oldest = validCookies.keys().next().value;
      if (oldest !== undefined) validCookies.delete(oldest);
    }
    return true;
  };

  const isCrossSite = (req: Request): boolean => {
    const fetchSite = req.headers['sec-fetch-site'];
    if (fetchSite === 'cross-site') return true;
    const origin = req.headers.origin;
    if (!origin) return false;
    try {
      return new URL(origin).host !== req.headers.host;
    } catch {
      // An unparseable Origin is treated as foreign.
      return true;
    }
  };

  const middleware: RequestHandler = (req: Request, res: Response, next: NextFunction) => {
    if (UNSAFE_METHODS.has(req.method)) {
      if (isCrossSite(req)) {
        logCsrfRefused(req, 'cross_site');
        return next(new HttpError(403, 'csrf', 'Cross-site requests are refused.'));
      }
      if (!validateRequest(req)) {
        logCsrfRefused(req, 'token');
        issue(req, res, true);
        return next(new HttpError(403, 'csrf', 'The security token is missing or out of date. Reload the page and try again.'));
      }
      return next();
    }
    if (!hasValidCookie(req)) issue(req, res, true);
    next();
  };

  return { middleware, reissue: (req, res) => issue(req, res, true) };
}
