import { Secret } from 'otpauth';
import request from 'supertest';
import type { Role } from '@tidemark/shared';
import { PENDING_LIMIT_MS } from '../../server/auth/second-factor-gate';
import { totpCode } from '../../server/auth/totp';
import { SessionRow } from '../../server/entities/session.entity';
import { ApiClient, createTestApp, demoEmail, signedInAs, type TestApp } from './support/test-app';

/** A moment at the start of a 30-second TOTP step (RFC 6238 §4.2, X = 30 s). */
const STEP_START = 58_920_000 * 30_000;
const STEP_MS = 30_000;

/** The clock every app of this file reads; tests move it forward a step at a time. */
let now = STEP_START;
const clock = (): number => now;

/** Raw TOTP secrets by e-mail, as the authenticator app of each enrolled person would hold them. */
const secrets = new Map<string, Uint8Array>();

/** Enrols the signed-in client; returns the raw secret and the recovery codes. */
async function enrol(client: ApiClient): Promise<{ secret: Uint8Array; recoveryCodes: string[] }> {
  const started = await client.post('/api/auth/second-factor/enrolment');
  expect(started.status).toBe(200);
  const secret = Secret.fromBase32(started.body.secret).bytes;
  secrets.set((await client.get('/api/auth/me')).body.user.email, secret);
  const confirmed = await client.post('/api/auth/second-factor/enrolment/confirm', { code: totpCode(secret, now) });
  expect(confirmed.status).toBe(200);
  return { secret, recoveryCodes: confirmed.body.recoveryCodes };
}

/** A fresh client past the password step of `role` (a code may still be due). */
async function passwordOnly(t: TestApp, role: Role): Promise<ApiClient> {
  const client = new ApiClient(t.app);
  const response = await client.signIn(demoEmail(role));
  expect(response.status).toBe(200);
  return client;
}

/** Moves the shared clock to the next TOTP step, so a new code exists. */
function nextStep(): void {
  now += STEP_MS;
}

// The tests of a block run in order and build on each other (who has enrolled), like a person's week.
describe('second factor, required for admin and audit lead', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({ secondFactor: 'required', clock });
  });
  afterAll(async () => {
    await t.close();
  });

  it('tells the sign-in page that codes are required', async () => {
    const response = await request(t.app).get('/api/auth/sign-in-options');
    expect(response.status).toBe(200);
    expect(response.body).toEqual({ secondFactorPolicy: 'required' });
  });

  it('keeps an administrator without codes on the enrolment calls until they enrol', async () => {
    const admin = new ApiClient(t.app);
    const login = await admin.signIn('admin@example.org');
    expect(login.status).toBe(200);
    expect(login.body.secondFactor).toBe('enrolment-required');
    const refused = await admin.get('/api/users');
    expect(refused.status).toBe(403);
    expect(refused.body.error.code).toBe('second_factor_enrolment_required');
    expect((await admin.get('/api/cases')).body.error.code).toBe('second_factor_enrolment_required');
    expect((await admin.get('/api/auth/me')).body).toMatchObject({ secondFactor: 'enrolment-required' });
    const status = await admin.get('/api/auth/second-factor');
    expect(status.body).toEqual({ isEnabled: false, enabledAt: null, recoveryCodesLeft: 0, isRequired: true, policy: 'required' });

    const started = await admin.post('/api/auth/second-factor/enrolment');
    expect(started.status).toBe(200);
    expect(started.headers['cache-control']).toBe('no-store');
    expect(started.body.secret).toMatch(/^[A-Z2-7]{32}$/);
    const uri = new URL(started.body.otpauthUri);
    expect(uri.searchParams.get('secret')).toBe(started.body.secret);
    expect(uri.searchParams.get('digits')).toBe('6');
    expect(uri.searchParams.get('period')).toBe('30');
    expect(started.body.qrCodeDataUrl).toMatch(/^data:image\/svg\+xml;base64,/);
    expect(Buffer.from(started.body.qrCodeDataUrl.split(',')[1], 'base64').toString('utf8')).toMatch(/^<svg /);

    const secret = Secret.fromBase32(started.body.secret).bytes;
    secrets.set('admin@example.org', secret);
    const wrong = await admin.post('/api/auth/second-factor/enrolment/confirm', { code: totpCode(secret, now + 5 * STEP_MS) });
    expect(wrong.status).toBe(401);
    expect(wrong.body.error.code).toBe('second_factor_invalid');
    expect(wrong.body.error.fields.code).toBeDefined();

    const sessionBefore = admin.sessionId();
    const confirmed = await admin.post('/api/auth/second-factor/enrolment/confirm', { code: totpCode(secret, now) });
    expect(confirmed.status).toBe(200);
    expect(confirmed.body.recoveryCodes).toHaveLength(10);
    expect(confirmed.body.session).toMatchObject({ user: { email: 'admin@example.org', role: 'admin' }, secondFactor: 'verified' });
    expect(admin.sessionId()).not.toBe(sessionBefore);
    expect((await admin.get('/api/users')).status).toBe(200);
    expect((await admin.get('/api/auth/second-factor')).body).toMatchObject({ isEnabled: true, recoveryCodesLeft: 10 });
  });

  it('signs in with password, then pending (401 everywhere else), wrong code 401, right code 200 with a new session', async () => {
    const lead = await passwordOnly(t, 'audit_lead');
    const { secret } = await enrol(lead);
    expect((await lead.post('/api/auth/logout')).status).toBe(204);
    nextStep();

    const client = new ApiClient(t.app);
    const login = await client.signIn('lead@example.org');
    expect(login.status).toBe(200);
    expect(login.body).toEqual({ user: expect.objectContaining({ email: 'lead@example.org' }), secondFactor: 'pending' });
    for (const url of ['/api/cases', '/api/audits', '/api/auth/second-factor', '/api/no-such-route']) {
      const refused = await client.get(url);
      expect(refused.status, url).toBe(401);
      expect(refused.body.error.code, url).toBe('second_factor_pending');
    }
    expect((await client.post('/api/auth/second-factor/recovery-codes', { code: totpCode(secret, now) })).body.error.code).toBe('second_factor_pending');
    expect((await client.get('/api/auth/me')).body.secondFactor).toBe('pending');

    const wrong = await client.post('/api/auth/second-factor/verify', { method: 'one-time-code', code: totpCode(secret, now + 3 * STEP_MS) });
    expect(wrong.status).toBe(401);
    expect(wrong.body.error.code).toBe('second_factor_invalid');
    const malformed = await client.post('/api/auth/second-factor/verify', { method: 'one-time-code', code: '12ab' });
    expect(malformed.status).toBe(400);
    expect(malformed.body.error.fields).toHaveProperty('code');

    const pendingCookie = client.sessionCookie;
    const pendingXsrf = client.xsrf;
    const right = await client.post('/api/auth/second-factor/verify', { method: 'one-time-code', code: totpCode(secret, now) });
    expect(right.status).toBe(200);
    expect(right.body).toEqual({ user: expect.objectContaining({ role: 'audit_lead' }), secondFactor: 'verified' });
    expect(client.sessionCookie).not.toBe(pendingCookie);
    expect(client.xsrf).not.toBe(pendingXsrf);
    expect((await client.get('/api/audits')).status).toBe(200);
    // The pending session's id is dead after the regeneration.
    expect((await request(t.app).get('/api/auth/me').set('Cookie', `tm.sid=${pendingCookie}`)).status).toBe(401);
    // A session that is not waiting for a code has nothing to verify.
    nextStep();
    expect((await client.post('/api/auth/second-factor/verify', { method: 'one-time-code', code: totpCode(secret, now) })).status).toBe(409);
  });

  it('refuses a code replayed in the same step, takes the next step', async () => {
    // The lead enrolled above: sign in with a fresh code, then replay it from another sign-in.
    const client = await passwordOnly(t, 'audit_lead');
    nextStep();
    const leadSecret = enrolledSecret('audit_lead');
    const code = totpCode(leadSecret, now);
    expect((await client.post('/api/auth/second-factor/verify', { method: 'one-time-code', code })).status).toBe(200);
    const replayer = await passwordOnly(t, 'audit_lead');
    const replay = await replayer.post('/api/auth/second-factor/verify', { method: 'one-time-code', code });
    expect(replay.status).toBe(401);
    expect(replay.body.error.code).toBe('second_factor_invalid');
    nextStep();
    expect((await replayer.post('/api/auth/second-factor/verify', { method: 'one-time-code', code: totpCode(leadSecret, now) })).status).toBe(200);
  });

  it('lets a recovery code in once', async () => {
    const lead = await signedInWithCode(t, 'audit_lead');
    nextStep();
    const codes = await lead.post('/api/auth/second-factor/recovery-codes', { code: totpCode(enrolledSecret('audit_lead'), now) });
    expect(codes.status).toBe(200);
    const [recovery] = codes.body.recoveryCodes as string[];

    const first = await passwordOnly(t, 'audit_lead');
    expect((await first.post('/api/auth/second-factor/verify', { method: 'recovery-code', code: recovery })).status).toBe(200);
    expect((await first.get('/api/cases')).status).toBe(200);
    const second = await passwordOnly(t, 'audit_lead');
    const reused = await second.post('/api/auth/second-factor/verify', { method: 'recovery-code', code: recovery });
    expect(reused.status).toBe(401);
    expect(reused.body.error.code).toBe('second_factor_invalid');
    expect((await first.get('/api/auth/second-factor')).body.recoveryCodesLeft).toBe(9);
  });

  it('puts another session of the same person on hold when they switch codes on elsewhere', async () => {
    const elsewhere = await passwordOnly(t, 'clinician');
    expect((await elsewhere.get('/api/cases')).status).toBe(200);
    const here = await passwordOnly(t, 'clinician');
    nextStep();
    await enrol(here);
    const refused = await elsewhere.get('/api/cases');
    expect(refused.status).toBe(401);
    expect(refused.body.error.code).toBe('second_factor_pending');
    expect((await here.get('/api/cases')).status).toBe(200);
  });

  it('ends a session that waits more than five minutes for its code', async () => {
    const client = await passwordOnly(t, 'audit_lead');
    const rows = t.dataSource.getRepository(SessionRow);
    const row = await rows.findOneByOrFail({ sid: client.sessionId() });
    const data = JSON.parse(row.data) as { signedInAt: number };
    data.signedInAt = Date.now() - PENDING_LIMIT_MS - 1000;
    await rows.update({ sid: row.sid }, { data: JSON.stringify(data) });
    const expired = await client.get('/api/auth/me');
    expect(expired.status).toBe(401);
    expect(expired.body.error.code).toBe('unauthenticated');
    expect(await rows.existsBy({ sid: row.sid })).toBe(false);
  });

  it('lets people outside the required roles switch codes off with a current code, ending their other sessions, never admins or audit leads', async () => {
    const partner = await passwordOnly(t, 'partner');
    expect((await partner.get('/api/auth/second-factor')).body).toMatchObject({ isEnabled: false, isRequired: false });
    nextStep();
    const { secret } = await enrol(partner);
    const wrong = await partner.post('/api/auth/second-factor/disable', { code: totpCode(secret, now) });
    expect(wrong.status).toBe(401);
    // A second session of the partner, past its code, ends when codes go off elsewhere (ASVS 5.0 §7.4.3).
    nextStep();
    const elsewhere = await passwordOnly(t, 'partner');
    expect((await elsewhere.post('/api/auth/second-factor/verify', { method: 'one-time-code', code: totpCode(secret, now) })).status).toBe(200);
    expect((await elsewhere.get('/api/cases')).status).toBe(200);
    nextStep();
    const off = await partner.post('/api/auth/second-factor/disable', { code: totpCode(secret, now) });
    expect(off.status).toBe(200);
    expect(off.body.secondFactor).toBe('none');
    expect((await partner.get('/api/cases')).status).toBe(200);
    expect((await elsewhere.get('/api/cases')).status).toBe(401);
    expect((await new ApiClient(t.app).signIn('partner@example.org')).body.secondFactor).toBe('none');

    const lead = await signedInWithCode(t, 'audit_lead');
    nextStep();
    const refused = await lead.post('/api/auth/second-factor/disable', { code: totpCode(enrolledSecret('audit_lead'), now) });
    expect(refused.status).toBe(403);
    expect((await lead.get('/api/auth/second-factor')).body.isEnabled).toBe(true);
  });

  it("lets an administrator reset a member's codes, which ends the member's sessions", async () => {
    const governance = await passwordOnly(t, 'governance');
    nextStep();
    await enrol(governance);
    const governanceId = (await governance.get('/api/auth/me')).body.user.id as number;
    const admin = await signedInWithCode(t, 'admin');

    expect((await governance.delete(`/api/users/${governanceId}/second-factor`)).status).toBe(403);
    const adminId = (await admin.get('/api/auth/me')).body.user.id as number;
    expect((await admin.delete(`/api/users/${adminId}/second-factor`)).status).toBe(409);
    expect((await admin.delete('/api/users/99999/second-factor')).status).toBe(404);
    expect((await admin.delete('/api/users/abc/second-factor')).status).toBe(400);

    expect((await admin.delete(`/api/users/${governanceId}/second-factor`)).status).toBe(204);
    expect((await governance.get('/api/auth/me')).status).toBe(401);
    const again = await new ApiClient(t.app).signIn('governance@example.org');
    expect(again.body.secondFactor).toBe('none');
  });
});

describe('second factor, offered only (demo mode)', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({ clock });
  });
  afterAll(async () => {
    await t.close();
  });

  it('signs admin and audit lead in with the password alone and says codes are offered', async () => {
    expect((await request(t.app).get('/api/auth/sign-in-options')).body).toEqual({ secondFactorPolicy: 'offered' });
    for (const role of ['admin', 'audit_lead'] as const) {
      const client = new ApiClient(t.app);
      expect((await client.signIn(demoEmail(role))).body.secondFactor).toBe('none');
    }
    const admin = await signedInAs(t.app, 'admin');
    expect((await admin.get('/api/users')).status).toBe(200);
    expect((await admin.get('/api/auth/second-factor')).body).toMatchObject({ isRequired: false, policy: 'offered' });
  });

  it('still asks for the code of someone who switched codes on, and lets an admin switch their own off', async () => {
    const admin = await signedInAs(t.app, 'admin');
    nextStep();
    const { secret } = await enrol(admin);
    const next = new ApiClient(t.app);
    expect((await next.signIn('admin@example.org')).body.secondFactor).toBe('pending');
    nextStep();
    expect((await next.post('/api/auth/second-factor/verify', { method: 'one-time-code', code: totpCode(secret, now) })).status).toBe(200);
    nextStep();
    expect((await next.post('/api/auth/second-factor/disable', { code: totpCode(secret, now) })).status).toBe(200);
  });
});

describe('second factor, rate limit on wrong codes', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({ secondFactor: 'required', clock, loginLimits: { perAccount: 3, perAddress: 50, windowMs: 60_000 } });
  });
  afterAll(async () => {
    await t.close();
  });

  it('answers 429 after repeated wrong codes, even to the right one, for that person only', async () => {
    const lead = await passwordOnly(t, 'audit_lead');
    nextStep();
    const { secret } = await enrol(lead);
    const client = await passwordOnly(t, 'audit_lead');
    nextStep();
    for (let attempt = 0; attempt < 3; attempt++) {
      expect((await client.post('/api/auth/second-factor/verify', { method: 'one-time-code', code: totpCode(secret, now + 4 * STEP_MS) })).status).toBe(401);
    }
    const limited = await client.post('/api/auth/second-factor/verify', { method: 'one-time-code', code: totpCode(secret, now) });
    expect(limited.status).toBe(429);
    expect(limited.body.error.code).toBe('rate_limited');
    expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0);
    const admin = await passwordOnly(t, 'admin');
    expect((await admin.post('/api/auth/second-factor/enrolment/confirm', { code: '000000' })).status).not.toBe(429);
  });
});

/** The raw TOTP secret of the demo account of `role`, enrolled earlier in this file. */
function enrolledSecret(role: Role): Uint8Array {
  const secret = secrets.get(demoEmail(role));
  if (!secret) throw new Error(`${role} has not enrolled in this test file yet.`);
  return secret;
}

/** A client of `role` past both steps, using the next step's code. */
async function signedInWithCode(t: TestApp, role: Role): Promise<ApiClient> {
  const client = await passwordOnly(t, role);
  nextStep();
  const verified = await client.post('/api/auth/second-factor/verify', { method: 'one-time-code', code: totpCode(enrolledSecret(role), now) });
  expect(verified.status).toBe(200);
  return client;
}
