import type { NextFunction, Request, Response } from 'express';
import { cookieNames } from './cookie-names';
import { createCsrfProtection, VALID_COOKIE_MEMORY } from './csrf';

const XSRF_COOKIE = cookieNames(false).xsrf;

const SECRET = 'csrf-spec-secret-that-is-long-enough-0123456789';

/** What one call of the middleware did: the token cookie it set (a reissue), if any, and what it passed on. */
interface Outcome {
  reissued: string | undefined;
  error: unknown;
}

/**
 * Runs the middleware on a minimal stand-in for Express's request and response: just what it
 * reads (method, headers, cookies, session id, session) and writes (`res.cookie`).
 */
function run(middleware: ReturnType<typeof createCsrfProtection>['middleware'], request: { method: string; sessionId: string; cookie?: string; header?: string }): Outcome {
  let reissued: string | undefined;
  let error: unknown;
  const req = {
    method: request.method,
    secure: false,
    sessionID: request.sessionId,
    session: {},
    cookies: request.cookie === undefined ? {} : { [XSRF_COOKIE]: request.cookie },
    headers: { host: 'localhost', ...(request.header === undefined ? {} : { 'x-xsrf-token': request.header }) },
  } as unknown as Request;
  const res = {
    cookie: (name: string, value: string) => {
      if (name === XSRF_COOKIE) reissued = value;
    },
  } as unknown as Response;
  const next: NextFunction = (passed?: unknown) => {
    error = passed;
  };
  middleware(req, res, next);
  return { reissued, error };
}

describe('CSRF cookie check on safe requests (signed double submit bound to the session, OWASP CSRF Prevention Cheat Sheet)', () => {
  it('keeps a valid cookie, reissues one bound to another session, and stays exact once tokens are remembered', () => {
    const { middleware } = createCsrfProtection(SECRET);
    const token = run(middleware, { method: 'GET', sessionId: 'session-a' }).reissued;
    expect(token).toBeDefined();
    // Valid for its own session: kept, the first time (checked) and the second (remembered).
    expect(run(middleware, { method: 'GET', sessionId: 'session-a', cookie: token }).reissued).toBeUndefined();
    expect(run(middleware, { method: 'GET', sessionId: 'session-a', cookie: token }).reissued).toBeUndefined();
    // The same token under another session id is not valid there, remembered for session-a or not.
    expect(run(middleware, { method: 'GET', sessionId: 'session-b', cookie: token }).reissued).toBeDefined();
    // A tampered token is not valid either.
    expect(run(middleware, { method: 'GET', sessionId: 'session-a', cookie: `0${token?.slice(1)}` }).reissued).toBeDefined();
  });

  it('forgets the longest-unseen sessions beyond its bound, and answers the same for them (checked again)', () => {
    const { middleware } = createCsrfProtection(SECRET);
    const first = run(middleware, { method: 'GET', sessionId: 'session-0' }).reissued;
    expect(run(middleware, { method: 'GET', sessionId: 'session-0', cookie: first }).reissued).toBeUndefined();
    for (let index = 1; index <= VALID_COOKIE_MEMORY + 10; index++) {
      const token = run(middleware, { method: 'GET', sessionId: `session-${index}` }).reissued;
      expect(run(middleware, { method: 'GET', sessionId: `session-${index}`, cookie: token }).reissued).toBeUndefined();
    }
    expect(run(middleware, { method: 'GET', sessionId: 'session-0', cookie: first }).reissued).toBeUndefined();
    expect(run(middleware, { method: 'GET', sessionId: 'session-1', cookie: first }).reissued).toBeDefined();
  });

  it('still checks every write in full: a remembered cookie without the matching header is refused', () => {
    const { middleware } = createCsrfProtection(SECRET);
    const token = run(middleware, { method: 'GET', sessionId: 'session-a' }).reissued;
    expect(run(middleware, { method: 'GET', sessionId: 'session-a', cookie: token }).reissued).toBeUndefined();
    expect(run(middleware, { method: 'POST', sessionId: 'session-a', cookie: token })).toMatchObject({ error: { status: 403, code: 'csrf' } });
    expect(run(middleware, { method: 'POST', sessionId: 'session-a', cookie: token, header: token })).toEqual({ reissued: undefined, error: undefined });
  });
});
