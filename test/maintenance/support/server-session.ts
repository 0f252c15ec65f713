import { DEMO_PASSWORD } from '../../../server/demo/demo-accounts';

/** One answer of the server: status and parsed JSON body (null when there is none). */
export interface ServerAnswer<T = unknown> {
  status: number;
  body: T;
}

/**
 * A signed-in browser stand-in for a Tidemark server running in another process (supertest's
 * ApiClient drives an in-process app): keeps the cookies and echoes the XSRF-TOKEN cookie in the
 * X-XSRF-TOKEN header on writes, as Angular's HttpClient does.
 */
export class ServerSession {
  private readonly cookies = new Map<string, string>();

  constructor(private readonly baseUrl: string) {}

  /** The same cookies, sent to another server (the same data dir started again on a new port). */
  pointedAt(baseUrl: string): ServerSession {
    const moved = new ServerSession(baseUrl);
    for (const [name, value] of this.cookies) moved.cookies.set(name, value);
    return moved;
  }

  /** One request; JSON (or a multipart form) in, JSON out. */
  async send<T = unknown>(method: 'GET' | 'POST' | 'PATCH' | 'DELETE', url: string, body?: object | FormData): Promise<ServerAnswer<T>> {
    if (method !== 'GET' && !this.cookies.has('XSRF-TOKEN')) await this.send('GET', '/api/auth/me');
    const headers: Record<string, string> = { cookie: [...this.cookies].map(([name, value]) => `${name}=${value}`).join('; ') };
    if (method !== 'GET') headers['x-xsrf-token'] = this.cookies.get('XSRF-TOKEN') ?? '';
    // fetch writes a form's multipart content type (with its boundary) itself.
    if (body !== undefined && !(body instanceof FormData)) headers['content-type'] = 'application/json';
    const payload = body === undefined || body instanceof FormData ? body : JSON.stringify(body);
    const response = await fetch(`${this.baseUrl}${url}`, { method, headers, body: payload, redirect: 'manual' });
    for (const line of response.headers.getSetCookie()) {
      const pair = line.split(';')[0];
      const name = pair.slice(0, pair.indexOf('='));
      const value = pair.slice(pair.indexOf('=') + 1);
      if (value) this.cookies.set(name, value);
      else this.cookies.delete(name);
    }
    const text = await response.text();
    return { status: response.status, body: (text && response.headers.get('content-type')?.includes('json') ? JSON.parse(text) : null) as T };
  }

  get<T = unknown>(url: string): Promise<ServerAnswer<T>> {
    return this.send<T>('GET', url);
  }

  post<T = unknown>(url: string, body: object | FormData): Promise<ServerAnswer<T>> {
    return this.send<T>('POST', url, body);
  }

  /** Signs in with the demo password (or `password`); throws unless the server says 200. */
  async signIn(email: string, password = DEMO_PASSWORD): Promise<number> {
    const answer = await this.post<{ user: { id: number } }>('/api/auth/login', { email, password });
    if (answer.status !== 200) throw new Error(`Sign-in as ${email} failed: ${answer.status} ${JSON.stringify(answer.body)}`);
    return answer.body.user.id;
  }
}
