import { createHmac, hkdfSync } from 'node:crypto';
import { Secret } from 'otpauth';
import { SESSION_ABSOLUTE_MS } from '../../../server/app';
import { totpCode } from '../../../server/auth/totp';
import { DEMO_PASSWORD } from '../../../server/demo/demo-accounts';
import { SessionRow } from '../../../server/entities/session.entity';
import { User } from '../../../server/entities/user.entity';
import { createCase, patientBody } from '../support/clinical-fixtures';
import { ApiClient, createTestApp, signedInAs, TEST_SECRET, type TestApp } from '../support/test-app';

/*
 * The security log (OWASP ASVS 5.0 §16.2.1, §16.3.1–16.3.3; server/logging/security-events.ts):
 * the real app at `info` writes into a sink, and each test reads the lines its requests added.
 * The last test scans every line written in this file for what must never be logged.
 */

type LogLine = Record<string, unknown>;

/** pino's numeric levels (pino docs, "Logger Levels"). */
const INFO = 30;
const WARN = 40;

/** A moment at the start of a 30-second TOTP step (RFC 6238 §4.2, X = 30 s), as in second-factor.api.spec.ts. */
const STEP_MS = 30_000;
let now = 58_920_000 * STEP_MS;
const clock = (): number => now;

/** A pino destination keeping every line, parsed. */
function lineSink(): { lines: LogLine[]; destination: { write(text: string): void } } {
  const lines: LogLine[] = [];
  const destination = {
    write(text: string): void {
      for (const part of text.split('\n').filter(Boolean)) lines.push(JSON.parse(part) as LogLine);
    },
  };
  return { lines, destination };
}

/** What the app must never write, collected as the tests send it. */
const secrets = new Set<string>([DEMO_PASSWORD]);

function remember(client: ApiClient): void {
  secrets.add(client.sessionCookie);
  secrets.add(decodeURIComponent(client.sessionCookie));
  secrets.add(client.sessionId());
  secrets.add(client.xsrf);
}

/** The keyed address hash, recomputed from its definition: HKDF-SHA-256 (RFC 5869), then HMAC-SHA-256 (RFC 2104), 16 hex. */
function expectedEmailHash(email: string): string {
  const key = Buffer.from(hkdfSync('sha256', TEST_SECRET, 'tidemark-security-log', 'sign-in-address', 32));
  return createHmac('sha256', key).update(email, 'utf8').digest('hex').slice(0, 16);
}

describe('security log (ASVS 5.0 §16.3)', () => {
  let t: TestApp;
  const sink = lineSink();
  let mark = 0;
  const ids: Record<string, number> = {};

  /**
   * Security events written since the last {@link markNow}, but for the 401 that every new
   * client's first, anonymous `GET /api/auth/me` (fetching its CSRF token) earns.
   */
  const events = (): LogLine[] =>
    sink.lines.slice(mark).filter((line) => 'event' in line && !(line['event'] === 'access.refused' && (line['req'] as LogLine)['path'] === '/api/auth/me' && line['userId'] === undefined));
  const markNow = (): void => {
    mark = sink.lines.length;
  };
  /** A client that already holds its CSRF token (its anonymous `GET /api/auth/me` is left before the mark). */
  const freshClient = async (): Promise<ApiClient> => {
    const client = new ApiClient(t.app);
    await client.get('/api/auth/me');
    return client;
  };
  const signedIn = async (email: string, password = DEMO_PASSWORD): Promise<ApiClient> => {
    const client = new ApiClient(t.app);
    expect((await client.signIn(email, password)).status).toBe(200);
    remember(client);
    return client;
  };
  const nextCode = (secret: Uint8Array): string => {
    now += STEP_MS;
    const code = totpCode(secret, now);
    secrets.add(code);
    return code;
  };

  beforeAll(async () => {
    t = await createTestApp({
      log: { level: 'info', destination: sink.destination },
      clock,
      loginLimits: { perAccount: 3, perAddress: 1000, windowMs: 60_000 },
      passwordChangeLimits: { perMember: 3, windowMs: 60_000 },
    });
    // More clinicians, whose passwords, roles and codes the tests change.
    for (const email of ['changes.own@example.org', 'changed.by.admin@example.org', 'tries.bypass@example.org']) await t.users.ensure({ email, displayName: 'Test clinician', role: 'clinician', password: DEMO_PASSWORD });
    for (const user of await t.dataSource.getRepository(User).find()) ids[user.email] = user.id;
  });
  afterAll(async () => {
    await t.close();
  });

  it('sign-in: success names the member and role; each refusal its reason, the account and a keyed hash of the address, once', async () => {
    const client = await freshClient();
    markNow();
    expect((await client.signIn('nobody@example.org', 'a-guess-at-a-pass-phrase')).status).toBe(401);
    expect((await client.signIn('Lead@Example.org', 'not-the-right-pass-phrase')).status).toBe(401);
    expect((await client.signIn('clinician@example.org')).status).toBe(200);
    remember(client);
    const login = { method: 'POST', path: '/api/auth/login' };
    const [unknown, wrong, success, ...rest] = events();
    expect(rest).toEqual([]);
    expect(unknown).toEqual(expect.objectContaining({ level: WARN, event: 'sign_in.refused', reason: 'unknown_account', emailHash: expectedEmailHash('nobody@example.org'), req: login }));
    expect(unknown).not.toHaveProperty('accountId');
    // Trimmed and lower-cased first, as the sign-in compares addresses.
    expect(wrong).toEqual(expect.objectContaining({ level: WARN, event: 'sign_in.refused', reason: 'wrong_password', accountId: ids['lead@example.org'], emailHash: expectedEmailHash('lead@example.org') }));
    expect(success).toEqual(
      expect.objectContaining({ level: INFO, event: 'sign_in.succeeded', userId: ids['clinician@example.org'], role: 'clinician', req: login, clientAddress: expect.stringContaining('127.0.0.1'), time: expect.any(Number) }),
    );
  });

  it('sign-in: the per-account limit is logged when reached', async () => {
    const client = await freshClient();
    markNow();
    const statuses: number[] = [];
    for (let attempt = 0; attempt < 4; attempt += 1) statuses.push((await client.signIn('guessed@example.org', `guess-number-${attempt}-xyz`)).status);
    expect(statuses).toEqual([401, 401, 401, 429]);
    expect(events().map((line) => [line['event'], line['level']])).toEqual([...Array(3).fill(['sign_in.refused', WARN]), ['sign_in.rate_limited', WARN]]);
    expect(events()[3]).toMatchObject({ limit: 'account', req: { path: '/api/auth/login' } });
  });

  it('second step: set-up refused then on, sign-out, a wrong code, a right code, a recovery code, new recovery codes, codes off', async () => {
    const userId = ids['lead@example.org'];
    const lead = await signedIn('lead@example.org');
    markNow();
    const started = await lead.post('/api/auth/second-factor/enrolment');
    secrets.add(started.body.secret);
    const secret = Secret.fromBase32(started.body.secret).bytes;
    const wrong = totpCode(secret, now + 5 * STEP_MS);
    secrets.add(wrong);
    expect((await lead.post('/api/auth/second-factor/enrolment/confirm', { code: wrong })).status).toBe(401);
    const confirmed = await lead.post('/api/auth/second-factor/enrolment/confirm', { code: nextCode(secret) });
    expect(confirmed.status).toBe(200);
    const recoveryCodes: string[] = confirmed.body.recoveryCodes;
    for (const code of recoveryCodes) secrets.add(code);
    remember(lead);
    expect((await lead.post('/api/auth/logout')).status).toBe(204);
    expect(events()).toEqual([
      expect.objectContaining({ level: WARN, event: 'second_factor.refused', userId, method: 'one-time-code', req: { method: 'POST', path: '/api/auth/second-factor/enrolment/confirm' } }),
      expect.objectContaining({ level: INFO, event: 'second_factor.enabled', userId }),
      expect.objectContaining({ level: INFO, event: 'sign_out', userId, req: { method: 'POST', path: '/api/auth/logout' } }),
    ]);

    markNow();
    const again = await signedIn('lead@example.org');
    expect((await again.post('/api/auth/second-factor/verify', { method: 'one-time-code', code: wrong })).status).toBe(401);
    expect((await again.post('/api/auth/second-factor/verify', { method: 'one-time-code', code: nextCode(secret) })).status).toBe(200);
    remember(again);
    const byRecovery = await signedIn('lead@example.org');
    expect((await byRecovery.post('/api/auth/second-factor/verify', { method: 'recovery-code', code: recoveryCodes[0] })).status).toBe(200);
    remember(byRecovery);
    const verify = { method: 'POST', path: '/api/auth/second-factor/verify' };
    expect(events()).toEqual([
      expect.objectContaining({ event: 'sign_in.succeeded', userId }),
      expect.objectContaining({ level: WARN, event: 'second_factor.refused', userId, method: 'one-time-code', req: verify }),
      expect.objectContaining({ level: INFO, event: 'second_factor.accepted', userId, method: 'one-time-code', req: verify }),
      expect.objectContaining({ event: 'sign_in.succeeded', userId }),
      expect.objectContaining({ level: WARN, event: 'second_factor.recovery_code_used', userId, req: verify }),
    ]);

    markNow();
    const renewed = await byRecovery.post('/api/auth/second-factor/recovery-codes', { code: nextCode(secret) });
    expect(renewed.status).toBe(200);
    for (const code of renewed.body.recoveryCodes as string[]) secrets.add(code);
    expect((await byRecovery.post('/api/auth/second-factor/disable', { code: nextCode(secret) })).status).toBe(200);
    expect(events()).toEqual([
      expect.objectContaining({ level: INFO, event: 'second_factor.recovery_codes_renewed', userId }),
      expect.objectContaining({ level: INFO, event: 'second_factor.disabled', userId }),
    ]);
  });

  it('second step: the wrong-code limit is logged when reached; an administrator reset names actor and member', async () => {
    const partnerId = ids['partner@example.org'];
    const partner = await signedIn('partner@example.org');
    const started = await partner.post('/api/auth/second-factor/enrolment');
    secrets.add(started.body.secret);
    const secret = Secret.fromBase32(started.body.secret).bytes;
    expect((await partner.post('/api/auth/second-factor/enrolment/confirm', { code: nextCode(secret) })).status).toBe(200);
    markNow();
    const statuses: number[] = [];
    for (let attempt = 0; attempt < 4; attempt += 1) statuses.push((await partner.post('/api/auth/second-factor/disable', { code: '000000' })).status);
    expect(statuses).toEqual([401, 401, 401, 429]);
    expect(events().map((line) => line['event'])).toEqual(['second_factor.refused', 'second_factor.refused', 'second_factor.refused', 'second_factor.rate_limited']);
    expect(events()[3]).toMatchObject({ level: WARN, userId: partnerId, req: { path: '/api/auth/second-factor/disable' } });

    const admin = await signedIn('admin@example.org');
    markNow();
    expect((await admin.delete(`/api/users/${partnerId}/second-factor`)).status).toBe(204);
    expect(events()).toEqual([expect.objectContaining({ level: INFO, event: 'second_factor.reset', userId: ids['admin@example.org'], accountId: partnerId })]);
  });

  it('passwords: own change refused (wrong current, common new), made (with the sessions it ended), and its limit reached', async () => {
    const userId = ids['changes.own@example.org'];
    const member = await signedIn('changes.own@example.org');
    await signedIn('changes.own@example.org');
    const newPassword = 'harbour-lights-at-dusk-41';
    secrets.add(newPassword);
    markNow();
    expect((await member.post('/api/auth/password', { currentPassword: 'not-my-pass-phrase', newPassword })).status).toBe(400);
    expect((await member.post('/api/auth/password', { currentPassword: DEMO_PASSWORD, newPassword: 'password1234' })).status).toBe(400);
    expect((await member.post('/api/auth/password', { currentPassword: DEMO_PASSWORD, newPassword })).status).toBe(200);
    const path = { method: 'POST', path: '/api/auth/password' };
    expect(events()).toEqual([
      expect.objectContaining({ level: WARN, event: 'password.change_refused', userId, reason: 'wrong_current_password', req: path }),
      expect.objectContaining({ level: WARN, event: 'password.change_refused', userId, reason: 'common_password' }),
      expect.objectContaining({ level: INFO, event: 'password.changed', userId, endedSessions: 1 }),
    ]);

    const governance = await signedIn('governance@example.org');
    markNow();
    const statuses: number[] = [];
    for (let attempt = 0; attempt < 4; attempt += 1) statuses.push((await governance.post('/api/auth/password', { currentPassword: `wrong-${attempt}-pass-phrase`, newPassword })).status);
    expect(statuses).toEqual([400, 400, 400, 429]);
    expect(events().at(-1)).toEqual(expect.objectContaining({ level: WARN, event: 'password.change_rate_limited', userId: ids['governance@example.org'] }));
  });

  it('administration: account created, password set, role changed, account switched off; a switched-off member signing in is refused as inactive', async () => {
    const adminId = ids['admin@example.org'];
    const admin = await signedIn('admin@example.org');
    const leaverPassword = 'tide-tables-and-sea-glass-7';
    const setPassword = 'admin-chosen-pass-phrase-12';
    secrets.add(leaverPassword);
    secrets.add(setPassword);
    markNow();
    const created = await admin.post('/api/users', { email: 'leaver@example.org', displayName: 'Lee Leaver', role: 'clinician', password: leaverPassword });
    expect(created.status).toBe(201);
    const memberId = ids['changed.by.admin@example.org'];
    expect((await admin.patch(`/api/users/${memberId}`, { password: setPassword, role: 'partner' })).status).toBe(200);
    expect((await admin.patch(`/api/users/${created.body.id}`, { active: false })).status).toBe(200);
    const refused = await freshClient();
    expect((await refused.signIn('leaver@example.org', leaverPassword)).status).toBe(401);
    expect(events()).toEqual([
      expect.objectContaining({ level: INFO, event: 'member.created', userId: adminId, accountId: created.body.id, role: 'clinician' }),
      expect.objectContaining({ level: INFO, event: 'password.set_by_admin', userId: adminId, accountId: memberId, req: { method: 'PATCH', path: `/api/users/${memberId}` } }),
      expect.objectContaining({ level: INFO, event: 'member.access_changed', userId: adminId, accountId: memberId, role: 'partner' }),
      expect.objectContaining({ level: INFO, event: 'member.access_changed', userId: adminId, accountId: created.body.id, active: false }),
      expect.objectContaining({ level: WARN, event: 'sign_in.refused', reason: 'inactive', accountId: created.body.id }),
    ]);
  });

  it('refused access: 403 from a role check and from a service at warn, 401 at info, each once, with the path but never the query', async () => {
    const clinician = await signedIn('clinician@example.org');
    const patient = patientBody();
    secrets.add(patient.code);
    expect((await clinician.post('/api/patients', patient)).status).toBe(201);
    // A request line for a search by code, so the final scan covers request lines too.
    expect((await clinician.get(`/api/patients?code=${patient.code}`)).status).toBe(200);
    const governance = await signedIn('governance@example.org');
    const anonymous = await freshClient();
    markNow();
    expect((await clinician.get('/api/users')).status).toBe(403);
    expect((await governance.get(`/api/patients?code=${patient.code}`)).status).toBe(403);
    expect((await anonymous.get('/api/cases')).status).toBe(401);
    const [roleCheck, service, signedOut, ...rest] = events();
    expect(rest).toEqual([]);
    expect(roleCheck).toEqual(expect.objectContaining({ level: WARN, event: 'access.refused', userId: ids['clinician@example.org'], status: 403, code: 'forbidden', req: { method: 'GET', path: '/api/users' } }));
    expect(service).toEqual(expect.objectContaining({ level: WARN, event: 'access.refused', userId: ids['governance@example.org'], status: 403, req: { method: 'GET', path: '/api/patients' } }));
    expect(signedOut).toEqual(expect.objectContaining({ level: INFO, event: 'access.refused', status: 401, code: 'unauthenticated', req: { method: 'GET', path: '/api/cases' } }));
    expect(signedOut).not.toHaveProperty('userId');
    expect(sink.lines.some((line) => line['msg'] === 'request completed' && (line['req'] as LogLine | undefined)?.['path'] === '/api/patients')).toBe(true);
  });

  it('CSRF: a write without the token and one from a foreign origin are each logged once, with their reason', async () => {
    const clinician = await signedIn('clinician@example.org');
    markNow();
    expect((await clinician.agent.post('/api/patients').send(patientBody())).status).toBe(403);
    expect((await clinician.agent.post('/api/patients').set('X-XSRF-TOKEN', clinician.xsrf).set('Origin', 'https://elsewhere.example').send(patientBody())).status).toBe(403);
    const csrf = { level: WARN, event: 'csrf.refused', userId: ids['clinician@example.org'], req: { method: 'POST', path: '/api/patients' } };
    expect(events()).toEqual([expect.objectContaining({ ...csrf, reason: 'token' }), expect.objectContaining({ ...csrf, reason: 'cross_site' })]);
  });

  it('sessions: ending one’s own other sessions and an administrator signing a member out everywhere are logged with how many ended', async () => {
    const here = await signedIn('partner@example.org');
    const elsewhere = [await signedIn('partner@example.org'), await signedIn('partner@example.org')];
    const handle = ((await here.get('/api/auth/sessions')).body as Array<{ id: string; isCurrent: boolean }>).find((session) => !session.isCurrent)?.id;
    markNow();
    expect((await here.delete(`/api/auth/sessions/${handle}`)).status).toBe(204);
    expect((await here.post('/api/auth/sessions/end-others')).status).toBe(200);
    const partnerId = ids['partner@example.org'];
    expect(events()).toEqual([
      expect.objectContaining({ level: INFO, event: 'sessions.ended', userId: partnerId, scope: 'own_one', endedSessions: 1 }),
      expect.objectContaining({ level: INFO, event: 'sessions.ended', userId: partnerId, scope: 'own_others', endedSessions: 1 }),
    ]);
    for (const client of elsewhere) expect((await client.get('/api/cases')).status).toBe(401);

    const admin = await signedIn('admin@example.org');
    markNow();
    expect((await admin.delete(`/api/users/${partnerId}/sessions`)).status).toBe(200);
    expect(events()).toEqual([expect.objectContaining({ level: INFO, event: 'sessions.ended', userId: ids['admin@example.org'], scope: 'member', endedSessions: 1, accountId: partnerId })]);
  });

  it('sessions: the absolute limit ending a session is logged with its member', async () => {
    const client = await signedIn('governance@example.org');
    const rows = t.dataSource.getRepository(SessionRow);
    const row = await rows.findOneByOrFail({ sid: client.sessionId() });
    const data = JSON.parse(row.data) as { signedInAt: number };
    data.signedInAt = Date.now() - SESSION_ABSOLUTE_MS - 1000;
    await rows.update({ sid: row.sid }, { data: JSON.stringify(data) });
    markNow();
    expect((await client.get('/api/auth/me')).status).toBe(401);
    expect(events()).toEqual([expect.objectContaining({ level: INFO, event: 'session.expired', reason: 'absolute', userId: ids['governance@example.org'] })]);
  });

  it('bypass attempts: a body the schema refuses (field names, not values), a case of another operator (a 404 that is a refusal), a call past a pending second step', async () => {
    const userId = ids['tries.bypass@example.org'];
    const member = await signedIn('tries.bypass@example.org');
    const patient = patientBody({ birthYear: 1700 });
    secrets.add(patient.code);
    markNow();
    expect((await member.post('/api/patients', patient)).status).toBe(400);
    expect(events()).toEqual([expect.objectContaining({ level: INFO, event: 'input.refused', userId, code: 'validation', fields: ['birthYear'], req: { method: 'POST', path: '/api/patients' } })]);

    const othersPatient = patientBody();
    secrets.add(othersPatient.code);
    const othersCase = await createCase(await signedIn('lead@example.org'), ids['clinician@example.org'], { patient: othersPatient });
    markNow();
    expect((await member.get(`/api/cases/${othersCase.id}`)).status).toBe(404);
    // A case that does not exist is a plain 404, not a refusal.
    expect((await member.get('/api/cases/999999')).status).toBe(404);
    expect(events()).toEqual([expect.objectContaining({ level: WARN, event: 'access.refused', userId, status: 404, code: 'not_found', req: { method: 'GET', path: `/api/cases/${othersCase.id}` } })]);

    const started = await member.post('/api/auth/second-factor/enrolment');
    secrets.add(started.body.secret);
    expect((await member.post('/api/auth/second-factor/enrolment/confirm', { code: nextCode(Secret.fromBase32(started.body.secret).bytes) })).status).toBe(200);
    const pending = await signedIn('tries.bypass@example.org');
    markNow();
    expect((await pending.get('/api/cases')).status).toBe(401);
    expect(events()).toEqual([expect.objectContaining({ level: INFO, event: 'access.refused', userId, status: 401, code: 'second_factor_pending', req: { method: 'GET', path: '/api/cases' } })]);
  });

  // Last: every line of this file's app, request lines included.
  it('never writes a password, code, session id, token, patient code or e-mail address', () => {
    // The file sent at least: the demo and 3 other passwords, 7 one-time codes, 20 recovery codes, 2 TOTP secrets, a patient code, cookies and tokens.
    expect(secrets.size).toBeGreaterThan(40);
    expect(sink.lines.length).toBeGreaterThan(100);
    for (const line of sink.lines) {
      // pino's own numbers can hold six digits in a row by chance; they are not request data.
      const { time: _time, pid: _pid, hostname: _hostname, responseTime: _responseTime, ...rest } = line;
      const text = JSON.stringify(rest);
      for (const secret of secrets) expect(text, String(line['msg'])).not.toContain(secret);
      expect(text).not.toContain('@example.org');
      expect(text).not.toContain('?');
    }
  });
});

describe('security log at warn (the e2e and bench level)', () => {
  let t: TestApp;
  const sink = lineSink();
  beforeAll(async () => {
    t = await createTestApp({ log: { level: 'warn', destination: sink.destination } });
  });
  afterAll(async () => {
    await t.close();
  });

  it('writes nothing for a successful sign-in, a read and a sign-out, and one line for a refused sign-in', async () => {
    const client = await signedInAs(t.app, 'partner');
    expect((await client.get('/api/cases')).status).toBe(200);
    expect((await client.post('/api/auth/logout')).status).toBe(204);
    expect(sink.lines).toEqual([]);
    expect((await new ApiClient(t.app).signIn('partner@example.org', 'not-the-right-pass-phrase')).status).toBe(401);
    // Above info the request's logger is built on first use, inside the router: the path must still be the whole one.
    expect(sink.lines).toEqual([expect.objectContaining({ level: WARN, event: 'sign_in.refused', reason: 'wrong_password', req: { method: 'POST', path: '/api/auth/login' } })]);
  });
});
