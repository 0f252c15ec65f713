import { Secret } from 'otpauth';
import type { OwnSession } from '@tidemark/shared';
import { totpCode } from '../../server/auth/totp';
import { SessionRow } from '../../server/entities/session.entity';
import { User } from '../../server/entities/user.entity';
import { ApiClient, createTestApp, demoEmail, type TestApp } from './support/test-app';

/*
 * A member's own sessions (OWASP ASVS 5.0 §7.5.2: users can see their active sessions and end
 * them) and an administrator ending a member's sessions (§7.4.5).
 */

/** User-Agent headers as two browsers send them (MDN "User-Agent" reference shapes). */
const FIREFOX_ON_LINUX = 'Mozilla/5.0 (X11; Linux x86_64; rv:133.0) Gecko/20100101 Firefox/133.0';
const SAFARI_ON_IPAD = 'Mozilla/5.0 (iPad; CPU OS 17_5 like Mac OS X) AppleWebKit/605.1.15 (KHTML, like Gecko) Version/17.5 Mobile/15E148 Safari/604.1';

/** A client signed in as the demo account of `role`, from a browser with this User-Agent. */
async function signedInFrom(t: TestApp, role: Parameters<typeof demoEmail>[0], userAgent: string): Promise<ApiClient> {
  const client = new ApiClient(t.app);
  client.agent.set('User-Agent', userAgent);
  const response = await client.signIn(demoEmail(role));
  expect(response.status).toBe(200);
  return client;
}

describe('/api/auth/sessions: one’s own sessions', () => {
  let t: TestApp;
  beforeEach(async () => {
    t = await createTestApp();
  });
  afterEach(async () => {
    await t.close();
  });

  it('lists the member’s live sessions with device and times, marks this one, and hands out no session id', async () => {
    const before = Date.now();
    const desk = await signedInFrom(t, 'clinician', FIREFOX_ON_LINUX);
    const tablet = await signedInFrom(t, 'clinician', SAFARI_ON_IPAD);
    await signedInFrom(t, 'partner', FIREFOX_ON_LINUX);

    const response = await desk.get('/api/auth/sessions');
    expect(response.status).toBe(200);
    const sessions = response.body as OwnSession[];
    // Only the clinician's two sessions, not the partner's.
    expect(sessions.map((session) => [session.device, session.isCurrent]).sort()).toEqual([
      ['Firefox on Linux', true],
      ['Safari on iOS', false],
    ]);
    for (const session of sessions) {
      expect(session.id).toMatch(/^[A-Za-z0-9_-]{22}$/);
      expect(Date.parse(session.signedInAt ?? '')).toBeGreaterThanOrEqual(before - 1000);
      // Last activity = stored idle expiry − 30 minutes: now, give or take the test's run.
      expect(Math.abs(Date.parse(session.lastActiveAt) - Date.now())).toBeLessThan(60_000);
    }
    // The handles are not the session ids (a listed id must not work as a cookie).
    const ids = [desk.sessionId(), tablet.sessionId()];
    expect(JSON.stringify(response.body)).not.toContain(ids[0]);
    expect(JSON.stringify(response.body)).not.toContain(ids[1]);
  });

  it('ends one other session by its handle; refuses the current one, another member’s and unknown handles', async () => {
    const desk = await signedInFrom(t, 'clinician', FIREFOX_ON_LINUX);
    const tablet = await signedInFrom(t, 'clinician', SAFARI_ON_IPAD);
    const partner = await signedInFrom(t, 'partner', FIREFOX_ON_LINUX);
    const listed = (await desk.get('/api/auth/sessions')).body as OwnSession[];
    const current = listed.find((session) => session.isCurrent);
    const other = listed.find((session) => !session.isCurrent);
    if (!current || !other) throw new Error('Expected two sessions.');

    expect((await desk.delete(`/api/auth/sessions/${current.id}`)).status).toBe(409);
    const partnerHandle = ((await partner.get('/api/auth/sessions')).body as OwnSession[])[0].id;
    // Another member's handle is not the clinician's to know: 404, and that session lives on.
    expect((await desk.delete(`/api/auth/sessions/${partnerHandle}`)).status).toBe(404);
    expect((await partner.get('/api/auth/me')).status).toBe(200);
    expect((await desk.delete('/api/auth/sessions/AAAAAAAAAAAAAAAAAAAAAA')).status).toBe(404);
    const malformed = await desk.delete('/api/auth/sessions/..%2F..%2Fusers');
    expect(malformed.status).toBe(400);
    expect(malformed.body.error.code).toBe('validation');
    expect((await tablet.get('/api/auth/me')).status).toBe(200);

    expect((await desk.delete(`/api/auth/sessions/${other.id}`)).status).toBe(204);
    expect((await tablet.get('/api/auth/me')).status).toBe(401);
    expect((await desk.get('/api/auth/me')).status).toBe(200);
    expect(((await desk.get('/api/auth/sessions')).body as OwnSession[]).map((session) => session.isCurrent)).toEqual([true]);
  });

  it('ends all the other sessions at once and says how many', async () => {
    const here = await signedInFrom(t, 'audit_lead', FIREFOX_ON_LINUX);
    const others = [await signedInFrom(t, 'audit_lead', SAFARI_ON_IPAD), await signedInFrom(t, 'audit_lead', FIREFOX_ON_LINUX)];
    const colleague = await signedInFrom(t, 'partner', FIREFOX_ON_LINUX);

    const response = await here.post('/api/auth/sessions/end-others');
    expect(response.status).toBe(200);
    expect(response.body).toEqual({ endedSessions: 2 });
    for (const other of others) expect((await other.get('/api/auth/me')).status).toBe(401);
    expect((await here.get('/api/auth/me')).status).toBe(200);
    expect((await colleague.get('/api/auth/me')).status).toBe(200);
  });

  it('stores the device in a few words, never the raw User-Agent, and keeps it through the one-time-code step', async () => {
    // Codes on for governance (an authenticator app's first code, RFC 6238 via server/auth/totp.ts).
    const enrolling = await signedInFrom(t, 'governance', FIREFOX_ON_LINUX);
    const started = await enrolling.post('/api/auth/second-factor/enrolment');
    const secret = Secret.fromBase32(started.body.secret).bytes;
    expect((await enrolling.post('/api/auth/second-factor/enrolment/confirm', { code: totpCode(secret, Date.now()) })).status).toBe(200);

    const tablet = await signedInFrom(t, 'governance', SAFARI_ON_IPAD);
    const waitingSid = tablet.sessionId();
    // The next step's code: the current one was just used (replays are refused), and ±1 step is accepted.
    expect((await tablet.post('/api/auth/second-factor/verify', { method: 'one-time-code', code: totpCode(secret, Date.now() + 30_000) })).status).toBe(200);
    expect(tablet.sessionId()).not.toBe(waitingSid);
    const row = await t.dataSource.getRepository(SessionRow).findOneByOrFail({ sid: tablet.sessionId() });
    expect(JSON.parse(row.data)).toMatchObject({ device: 'Safari on iOS' });
    expect(row.data).not.toContain('AppleWebKit');
  });

  it('is for signed-in members only', async () => {
    const anonymous = new ApiClient(t.app);
    expect((await anonymous.get('/api/auth/sessions')).status).toBe(401);
    expect((await anonymous.post('/api/auth/sessions/end-others')).status).toBe(401);
  });
});

describe('DELETE /api/users/:id/sessions: an administrator ends a member’s sessions', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(async () => {
    await t.close();
  });

  it('ends every session of that member and no one else’s; refuses their own account, unknown members and other roles', async () => {
    const admin = await signedInFrom(t, 'admin', FIREFOX_ON_LINUX);
    const clinicianSessions = [await signedInFrom(t, 'clinician', FIREFOX_ON_LINUX), await signedInFrom(t, 'clinician', SAFARI_ON_IPAD)];
    const partner = await signedInFrom(t, 'partner', FIREFOX_ON_LINUX);
    const users = t.dataSource.getRepository(User);
    const clinicianId = (await users.findOneByOrFail({ email: demoEmail('clinician') })).id;
    const adminId = (await users.findOneByOrFail({ email: demoEmail('admin') })).id;

    expect((await partner.delete(`/api/users/${clinicianId}/sessions`)).status).toBe(403);
    expect((await admin.delete(`/api/users/${adminId}/sessions`)).status).toBe(409);
    expect((await admin.delete('/api/users/999999/sessions')).status).toBe(404);
    for (const client of clinicianSessions) expect((await client.get('/api/auth/me')).status).toBe(200);

    const response = await admin.delete(`/api/users/${clinicianId}/sessions`);
    expect(response.status).toBe(200);
    expect(response.body).toEqual({ endedSessions: 2 });
    for (const client of clinicianSessions) expect((await client.get('/api/auth/me')).status).toBe(401);
    expect((await partner.get('/api/auth/me')).status).toBe(200);
    expect((await admin.get('/api/auth/me')).status).toBe(200);
  });
});
