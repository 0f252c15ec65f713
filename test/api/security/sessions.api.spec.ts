import request from 'supertest';
import { SESSION_IDLE_MS } from '../../../server/app';
import { SessionRow } from '../../../server/entities/session.entity';
import { ApiClient, createTestApp, demoEmail, signedInAs, type TestApp } from '../support/test-app';

/*
 * Session rules not already covered by test/api/auth.api.spec.ts (fixation, logout, CSRF basics,
 * absolute expiry, the per-account limit): the 30-minute idle expiry observed through the API as
 * the clock moves, and the sign-in limit per address (OWASP Authentication Cheat Sheet: limit
 * failed attempts per account and per source).
 */

const MINUTE = 60_000;

describe('idle expiry: 30 minutes without a request ends the session (server/app.ts SESSION_IDLE_MS)', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(async () => {
    vi.useRealTimers();
    await t.close();
  });
  afterEach(() => {
    vi.useRealTimers();
  });

  /** `/api/auth/me` with the session cookie set by hand: the agent's own jar would drop an expired cookie before the server could judge it. */
  const meWith = (sessionCookie: string) => request(t.app).get('/api/auth/me').set('Cookie', `tm.sid=${sessionCookie}`);

  it('is 30 minutes', () => {
    expect(SESSION_IDLE_MS).toBe(30 * MINUTE);
  });

  it('keeps a session used every 29 minutes alive past 30 minutes, and ends it 30 minutes after the last request', async () => {
    // Only Date is faked: timers, sockets and the database keep running for real.
    vi.useFakeTimers({ toFake: ['Date'] });
    const start = Date.now();
    const client = await signedInAs(t.app, 'clinician');
    const cookie = client.sessionCookie;

    vi.setSystemTime(start + 29 * MINUTE);
    expect((await meWith(cookie)).status).toBe(200);
    // 58 minutes after sign-in but 29 after the last request: still signed in (rolling idle limit, not an absolute one).
    vi.setSystemTime(start + 58 * MINUTE);
    expect((await meWith(cookie)).status).toBe(200);

    // 30 minutes and one second after the last request, the server itself refuses the same cookie.
    vi.setSystemTime(start + 88 * MINUTE + 1000);
    const expired = await meWith(cookie);
    expect(expired.status).toBe(401);
    expect(expired.body.error.code).toBe('unauthenticated');
    // And it stays refused: the expired session is not revived by the attempt.
    expect((await meWith(cookie)).status).toBe(401);
  });

  it('refuses a write on an idle-expired session and its token, storing nothing', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    const start = Date.now();
    const client = await signedInAs(t.app, 'partner');
    await client.get('/api/auth/me');
    const patients = await t.dataSource.query('SELECT COUNT(*) AS n FROM patient');
    vi.setSystemTime(start + SESSION_IDLE_MS + 1000);
    const response = await request(t.app)
      .post('/api/patients')
      .set('Cookie', `tm.sid=${client.sessionCookie}; XSRF-TOKEN=${client.xsrf}`)
      .set('X-XSRF-TOKEN', client.xsrf)
      .send({ code: 'IDLE-0001', birthYear: 1980, sex: 'female', smoking: 'never', cigarettesPerDay: null, diabetes: 'none', phenotype: 'thin', phenotypeMethod: 'probe-visibility' });
    // The expired session is gone, so is the token bound to it (csrf-csrf ties tokens to the session id): refused before any service runs.
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('csrf');
    expect(await t.dataSource.query('SELECT COUNT(*) AS n FROM patient')).toEqual(patients);
    const row = await t.dataSource.getRepository(SessionRow).findOneBy({ sid: client.sessionId() });
    expect(row === null || Number(row.expiresAt) <= Date.now()).toBe(true);
  });
});

describe('sign-in limit per address (any account)', () => {
  let t: TestApp;
  beforeAll(async () => {
    // Behind a trusted proxy the address is the X-Forwarded-For client (documentation addresses, RFC 5737; no traffic is sent there).
    t = await createTestApp({ loginLimits: { perAccount: 100, perAddress: 3, windowMs: 60_000 }, trustProxy: true });
  });
  afterAll(async () => {
    await t.close();
  });

  const signInFrom = (client: ApiClient, address: string, email: string, password: string) =>
    client.agent.post('/api/auth/login').set('X-Forwarded-For', address).set('X-XSRF-TOKEN', client.xsrf).send({ email, password });

  it('answers 429 to an address after 3 failures spread over different accounts, even for a right password; another address still signs in', async () => {
    const client = new ApiClient(t.app);
    await client.get('/api/auth/me');
    const noisy = '203.0.113.7';
    for (const role of ['clinician', 'partner', 'governance'] as const) {
      expect((await signInFrom(client, noisy, demoEmail(role), 'wrong-password-x')).status).toBe(401);
    }
    const limited = await signInFrom(client, noisy, demoEmail('clinician'), 'tidemark-demo');
    expect(limited.status).toBe(429);
    expect(limited.body.error.code).toBe('rate_limited');
    expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0);
    // A fourth account never tried from this address is refused as well: the limit is per address.
    expect((await signInFrom(client, noisy, 'second.unknown@example.org', 'wrong-password-x')).status).toBe(429);

    const other = new ApiClient(t.app);
    await other.get('/api/auth/me');
    expect((await signInFrom(other, '198.51.100.9', demoEmail('clinician'), 'tidemark-demo')).status).toBe(200);
  });
});
