/** Cookies of a signed-in session, as a browser would hold them after signing in. */
export interface SignedInSession {
  /** name → value of every cookie the server set (the session and the XSRF token). */
  cookies: Map<string, string>;
  /** The `Cookie` request header carrying them all. */
  cookieHeader: string;
}

function remember(cookies: Map<string, string>, response: Response): void {
  for (const line of response.headers.getSetCookie()) {
    const pair = line.split(';')[0];
    const at = pair.indexOf('=');
    if (at > 0) cookies.set(pair.slice(0, at), pair.slice(at + 1));
  }
}

const headerOf = (cookies: Map<string, string>): string => [...cookies].map(([name, value]) => `${name}=${value}`).join('; ');

/**
 * Signs in over HTTP as the app's own client does (test/api/support/test-app.ts ApiClient): a
 * first GET for the XSRF-TOKEN cookie, then the POST with the token echoed in X-XSRF-TOKEN.
 * Passing both cookies on later requests keeps the CSRF check from issuing a new token each time.
 *
 * @throws {Error} when sign-in does not answer 200
 */
export async function signIn(baseUrl: string, email: string, password: string): Promise<SignedInSession> {
  const cookies = new Map<string, string>();
  remember(cookies, await fetch(`${baseUrl}/api/auth/me`));
  const token = cookies.get('XSRF-TOKEN');
  if (!token) throw new Error('The server set no XSRF-TOKEN cookie.');
  const response = await fetch(`${baseUrl}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', cookie: headerOf(cookies), 'x-xsrf-token': decodeURIComponent(token) },
    body: JSON.stringify({ email, password }),
  });
  if (response.status !== 200) throw new Error(`Sign-in as ${email} answered ${response.status}: ${await response.text()}`);
  remember(cookies, response);
  return { cookies, cookieHeader: headerOf(cookies) };
}
