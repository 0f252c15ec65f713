import request, { type Response } from 'supertest';
import { DEMO_PASSWORD } from '../../../server/demo/demo-accounts';
import { createTestApp, demoEmail, setCookieLine, type TestApp } from '../support/test-app';

/*
 * An installation reached over HTTPS only (APP_URL https://…, behind a TLS proxy named by
 * TRUST_PROXY) names its cookies with the `__Host-` prefix (OWASP ASVS 5.0 §3.3.1, §3.3.3;
 * RFC 6265bis §4.1.3.2: Secure, Path=/ and no Domain, or the browser refuses the cookie).
 * Requests carry `X-Forwarded-Proto: https` as the proxy would. The cookies are sent by hand:
 * supertest's jar, rightly, keeps Secure cookies off plain-HTTP requests.
 */

const HTTPS = { 'X-Forwarded-Proto': 'https' };

/** name=value of every cookie a response sets. */
function cookiesOf(response: Response): Map<string, string> {
  const lines = ([] as string[]).concat(response.headers['set-cookie'] ?? []);
  return new Map(lines.map((line) => line.split(';')[0]).map((pair) => [pair.slice(0, pair.indexOf('=')), pair.slice(pair.indexOf('=') + 1)]));
}

/** The cookie's attributes, lower-cased, without its value. */
function attributesOf(line: string | undefined): string[] {
  return (line ?? '').split(';').slice(1).map((part) => part.trim().toLowerCase());
}

describe('__Host- cookies when the installation is reached over HTTPS only', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({ isHttpsOnly: true, trustProxy: true });
  });
  afterAll(async () => {
    await t.close();
  });

  it('signs in, writes and signs out with __Host-tm.sid and __Host-XSRF-TOKEN, each Secure, for path / and without a Domain', async () => {
    const first = await request(t.app).get('/api/auth/me').set(HTTPS);
    const xsrfLine = setCookieLine(first, '__Host-XSRF-TOKEN');
    expect(xsrfLine).toBeDefined();
    expect(attributesOf(xsrfLine)).toEqual(expect.arrayContaining(['path=/', 'secure', 'samesite=lax']));
    expect(attributesOf(xsrfLine).some((attribute) => attribute.startsWith('domain='))).toBe(false);
    // The unprefixed names of a plain-HTTP installation are never set here.
    expect(setCookieLine(first, 'XSRF-TOKEN')).toBeUndefined();

    const jar = cookiesOf(first);
    const cookieHeader = (): string => [...jar].map(([name, value]) => `${name}=${value}`).join('; ');
    const token = (): string => decodeURIComponent(jar.get('__Host-XSRF-TOKEN') ?? '');
    const signIn = await request(t.app).post('/api/auth/login').set(HTTPS).set('Cookie', cookieHeader()).set('X-XSRF-TOKEN', token()).send({ email: demoEmail('partner'), password: DEMO_PASSWORD });
    expect(signIn.status).toBe(200);
    const sessionLine = setCookieLine(signIn, '__Host-tm.sid');
    expect(attributesOf(sessionLine)).toEqual(expect.arrayContaining(['path=/', 'secure', 'httponly', 'samesite=lax']));
    expect(attributesOf(sessionLine).some((attribute) => attribute.startsWith('domain='))).toBe(false);
    expect(setCookieLine(signIn, 'tm.sid')).toBeUndefined();
    for (const [name, value] of cookiesOf(signIn)) jar.set(name, value);

    expect((await request(t.app).get('/api/auth/me').set(HTTPS).set('Cookie', cookieHeader())).status).toBe(200);
    // The token travels in the prefixed cookie and the header; a write without the header is refused.
    const withoutToken = await request(t.app).post('/api/auth/sessions/end-others').set(HTTPS).set('Cookie', cookieHeader());
    expect(withoutToken.status).toBe(403);
    const withToken = await request(t.app).post('/api/auth/sessions/end-others').set(HTTPS).set('Cookie', cookieHeader()).set('X-XSRF-TOKEN', token());
    expect(withToken.status).toBe(200);

    const signOut = await request(t.app).post('/api/auth/logout').set(HTTPS).set('Cookie', cookieHeader()).set('X-XSRF-TOKEN', token());
    expect(signOut.status).toBe(204);
    // Cleared with the attributes it was set with, or a browser would keep it.
    expect(attributesOf(setCookieLine(signOut, '__Host-tm.sid'))).toEqual(expect.arrayContaining(['path=/', 'secure', 'httponly']));
    expect((await request(t.app).get('/api/auth/me').set(HTTPS).set('Cookie', cookieHeader())).status).toBe(401);
  });

  it('does not set the session cookie at all on a request that did not come over HTTPS', async () => {
    const first = await request(t.app).get('/api/auth/me');
    const jar = cookiesOf(first);
    const signIn = await request(t.app)
      .post('/api/auth/login')
      .set('Cookie', [...jar].map(([name, value]) => `${name}=${value}`).join('; '))
      .set('X-XSRF-TOKEN', decodeURIComponent(jar.get('__Host-XSRF-TOKEN') ?? ''))
      .send({ email: demoEmail('partner'), password: DEMO_PASSWORD });
    expect(setCookieLine(signIn, '__Host-tm.sid')).toBeUndefined();
    expect(setCookieLine(signIn, 'tm.sid')).toBeUndefined();
  });
});
