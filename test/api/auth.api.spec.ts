import request from 'supertest';
import { SessionRow } from '../../server/entities/session.entity';
import { SESSION_ABSOLUTE_MS } from '../../server/app';
import { SIGN_IN_FAILED_MESSAGE } from '../../server/auth/passport-setup';
import { ApiClient, cookieFrom, createTestApp, setCookieLine, signedInAs, type TestApp } from './support/test-app';

describe('sign-in, sessions and CSRF', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(async () => {
    await t.close();
  });

  it('signs in a demo account and answers /me with the same shape', async () => {
    const client = new ApiClient(t.app);
    const login = await client.signIn('Lead@Example.org');
    expect(login.status).toBe(200);
    expect(login.body).toEqual({ user: { id: expect.any(Number), email: 'lead@example.org', displayName: expect.any(String), role: 'audit_lead' }, secondFactor: 'none' });
    const me = await client.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body).toEqual(login.body);
  });

  it('gives one message for an unknown e-mail and a wrong password', async () => {
    const client = new ApiClient(t.app);
    const unknown = await client.signIn('nobody@example.org', 'whatever-password');
    const wrong = await client.signIn('lead@example.org', 'not-the-password');
    expect(unknown.status).toBe(401);
    expect(wrong.status).toBe(401);
    expect(unknown.body.error.message).toBe(SIGN_IN_FAILED_MESSAGE);
    expect(wrong.body.error.message).toBe(SIGN_IN_FAILED_MESSAGE);
    expect(unknown.body.error.code).toBe('unauthenticated');
  });

  it('refuses an inactive user with the same message', async () => {
    const admin = await signedInAs(t.app, 'admin');
    const created = await admin.post('/api/users', { email: 'locum@example.org', displayName: 'Locum', role: 'clinician', password: 'a-long-locum-passphrase' });
    expect(created.status).toBe(201);
    expect((await admin.patch(`/api/users/${created.body.id}`, { active: false })).status).toBe(200);
    const client = new ApiClient(t.app);
    const response = await client.signIn('locum@example.org', 'a-long-locum-passphrase');
    expect(response.status).toBe(401);
    expect(response.body.error.message).toBe(SIGN_IN_FAILED_MESSAGE);
  });

  it('sets the session cookie with a non-default name, HttpOnly, SameSite=Lax, no Secure over plain HTTP', async () => {
    const client = new ApiClient(t.app);
    const login = await client.signIn('partner@example.org');
    const line = setCookieLine(login, 'tm.sid');
    expect(line).toBeDefined();
    expect(line).toMatch(/HttpOnly/i);
    expect(line).toMatch(/SameSite=Lax/i);
    expect(line).not.toMatch(/Secure/i);
    expect(setCookieLine(login, 'connect.sid')).toBeUndefined();
    // The CSRF cookie must be readable by the page script (double submit).
    expect(setCookieLine(login, 'XSRF-TOKEN')).not.toMatch(/HttpOnly/i);
  });

  it('marks the session cookie Secure when served over HTTPS behind a trusted proxy', async () => {
    const secure = await createTestApp({ trustProxy: true });
    try {
      // A plain-HTTP test client would not send Secure cookies back, so carry them by hand.
      const first = await request(secure.app).get('/api/auth/me').set('X-Forwarded-Proto', 'https');
      expect(setCookieLine(first, 'tm.sid')).toMatch(/;\s*Secure/i);
      const xsrf = cookieFrom(first, 'XSRF-TOKEN') ?? '';
      const login = await request(secure.app)
        .post('/api/auth/login')
        .set('X-Forwarded-Proto', 'https')
        .set('Cookie', `tm.sid=${cookieFrom(first, 'tm.sid')}; XSRF-TOKEN=${xsrf}`)
        .set('X-XSRF-TOKEN', xsrf)
        .send({ email: 'admin@example.org', password: 'tidemark-demo' });
      expect(login.status).toBe(200);
      expect(setCookieLine(login, 'tm.sid')).toMatch(/;\s*Secure/i);
    } finally {
      await secure.close();
    }
  });

  it('regenerates the session on sign-in (the cookie changes)', async () => {
    const client = new ApiClient(t.app);
    const before = cookieFrom(await client.get('/api/auth/me'), 'tm.sid');
    expect(before).toBeDefined();
    const login = await client.signIn('clinician@example.org');
    const after = cookieFrom(login, 'tm.sid');
    expect(after).toBeDefined();
    expect(after).not.toBe(before);
  });

  it('rejects a write without the X-XSRF-TOKEN header (403 csrf) and stores nothing', async () => {
    const agent = request.agent(t.app);
    await agent.get('/api/auth/me');
    const response = await agent.post('/api/auth/login').send({ email: 'admin@example.org', password: 'tidemark-demo' });
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('csrf');
    expect((await agent.get('/api/auth/me')).status).toBe(401);
  });

  it('rejects a header that does not match the cookie', async () => {
    const client = new ApiClient(t.app);
    await client.get('/api/auth/me');
    client.xsrf = 'forged.value';
    const response = await client.signIn('admin@example.org');
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('csrf');
  });

  it('refuses cross-site writes even with a valid token', async () => {
    const client = await signedInAs(t.app, 'admin');
    const crossSite = await client.agent.post('/api/auth/logout').set('X-XSRF-TOKEN', client.xsrf).set('Sec-Fetch-Site', 'cross-site');
    expect(crossSite.status).toBe(403);
    const foreignOrigin = await client.agent.post('/api/auth/logout').set('X-XSRF-TOKEN', client.xsrf).set('Origin', 'https://evil.example.net');
    expect(foreignOrigin.status).toBe(403);
    expect((await client.get('/api/auth/me')).status).toBe(200);
  });

  it('logs out on the server: the old cookie no longer works', async () => {
    const client = await signedInAs(t.app, 'partner');
    const sid = cookieFrom(await client.get('/api/auth/me'), 'tm.sid');
    expect((await client.post('/api/auth/logout')).status).toBe(204);
    const replay = await request(t.app).get('/api/auth/me').set('Cookie', `tm.sid=${sid}`);
    expect(replay.status).toBe(401);
  });

  it('ends every session of a user who is deactivated', async () => {
    const admin = await signedInAs(t.app, 'admin');
    const created = await admin.post('/api/users', { email: 'temp.clinician@example.org', displayName: 'Temp', role: 'clinician', password: 'temporary-pass-phrase' });
    const temp = new ApiClient(t.app);
    expect((await temp.signIn('temp.clinician@example.org', 'temporary-pass-phrase')).status).toBe(200);
    expect((await temp.get('/api/auth/me')).status).toBe(200);
    await admin.patch(`/api/users/${created.body.id}`, { active: false });
    expect((await temp.get('/api/auth/me')).status).toBe(401);
    expect(await t.dataSource.getRepository(SessionRow).countBy({ userId: created.body.id })).toBe(0);
  });

  it('ends a session 8 hours after sign-in even when active', async () => {
    const client = await signedInAs(t.app, 'governance');
    const rows = t.dataSource.getRepository(SessionRow);
    const row = await rows.findOneByOrFail({ sid: client.sessionId() });
    const data = JSON.parse(row.data) as { signedInAt: number };
    data.signedInAt = Date.now() - SESSION_ABSOLUTE_MS - 1000;
    await rows.update({ sid: row.sid }, { data: JSON.stringify(data) });
    expect((await client.get('/api/auth/me')).status).toBe(401);
  });

  it('stores sessions with a 30-minute idle expiry and prunes expired rows', async () => {
    const client = await signedInAs(t.app, 'clinician');
    const rows = t.dataSource.getRepository(SessionRow);
    const row = await rows.findOneByOrFail({ sid: client.sessionId() });
    const remaining = Number(row.expiresAt) - Date.now();
    expect(remaining).toBeGreaterThan(29 * 60 * 1000);
    expect(remaining).toBeLessThanOrEqual(30 * 60 * 1000);
    await rows.update({ sid: row.sid }, { expiresAt: Date.now() - 1 });
    expect((await client.get('/api/auth/me')).status).toBe(401);
    expect(await t.sessions.pruneExpired()).toBeGreaterThanOrEqual(1);
    expect(await rows.existsBy({ sid: row.sid })).toBe(false);
  });

  it('answers 400 with field errors for a malformed sign-in', async () => {
    const client = new ApiClient(t.app);
    const response = await client.post('/api/auth/login', { email: 'not-an-email' });
    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('validation');
    expect(Object.keys(response.body.error.fields).sort()).toEqual(['email', 'password']);
  });

  it('answers 400, not 500, for a body that is not JSON', async () => {
    const client = new ApiClient(t.app);
    await client.get('/api/auth/me');
    const response = await client.agent.post('/api/auth/login').set('X-XSRF-TOKEN', client.xsrf).set('Content-Type', 'application/json').send('{"email": ');
    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('validation');
    expect(JSON.stringify(response.body)).not.toMatch(/at .*\.ts/);
  });
});

describe('sign-in rate limit', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({ loginLimits: { perAccount: 3, perAddress: 50, windowMs: 60_000 } });
  });
  afterAll(async () => {
    await t.close();
  });

  it('answers 429 with Retry-After after repeated failures on one account, and not for another account', async () => {
    const client = new ApiClient(t.app);
    for (let attempt = 0; attempt < 3; attempt++) {
      expect((await client.signIn('lead@example.org', 'wrong-password-x')).status).toBe(401);
    }
    const limited = await client.signIn('lead@example.org', 'wrong-password-x');
    expect(limited.status).toBe(429);
    expect(limited.body.error.code).toBe('rate_limited');
    expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0);
    // Even the right password is refused while the account is limited.
    expect((await client.signIn('lead@example.org')).status).toBe(429);
    expect((await client.signIn('partner@example.org')).status).toBe(200);
  });
});
