import { DEMO_PASSWORD } from '../../server/demo/demo-accounts';
import { MailMessage } from '../../server/entities/mail-message.entity';
import { SessionRow } from '../../server/entities/session.entity';
import { User } from '../../server/entities/user.entity';
import { DEFAULT_PASSWORD_CHANGE_LIMITS } from '../../server/routes/password.routes';
import { ApiClient, createTestApp, demoEmail, signedInAs, type TestApp } from './support/test-app';

/*
 * A member changes their own password (OWASP ASVS 5.0 §6.2.2 "users can change their password",
 * §6.2.3 "the change asks for the current and the new password", §7.4.3 "other sessions end
 * after an authentication factor changes"), and the member is told by e-mail (common practice).
 */

const NEW_PASSWORD = 'tide-pool-lantern-harbour-7';

async function passwordHashOf(t: TestApp, email: string): Promise<string> {
  return (await t.dataSource.getRepository(User).findOneByOrFail({ email })).passwordHash;
}

describe('POST /api/auth/password: changing one’s own password', () => {
  let t: TestApp;
  beforeEach(async () => {
    t = await createTestApp();
  });
  afterEach(async () => {
    await t.close();
  });

  it('changes the password, keeps this session, ends the member’s other sessions and no one else’s, and tells them by e-mail', async () => {
    const email = demoEmail('clinician');
    const here = await signedInAs(t.app, 'clinician');
    const elsewhere = await signedInAs(t.app, 'clinician');
    const colleague = await signedInAs(t.app, 'partner');
    expect((await elsewhere.get('/api/auth/me')).status).toBe(200);

    const response = await here.post('/api/auth/password', { currentPassword: DEMO_PASSWORD, newPassword: NEW_PASSWORD });
    expect(response.status).toBe(200);
    expect(response.body).toEqual({ endedSessions: 1 });

    // This session carries on; the other one of the same person is over; a colleague's is untouched.
    expect((await here.get('/api/auth/me')).status).toBe(200);
    expect((await elsewhere.get('/api/auth/me')).status).toBe(401);
    expect((await colleague.get('/api/auth/me')).status).toBe(200);
    expect(await t.dataSource.getRepository(SessionRow).existsBy({ sid: here.sessionId() })).toBe(true);

    // The old password no longer signs in; the new one does.
    expect((await new ApiClient(t.app).signIn(email, DEMO_PASSWORD)).status).toBe(401);
    expect((await new ApiClient(t.app).signIn(email, NEW_PASSWORD)).status).toBe(200);

    const notices = await t.dataSource.getRepository(MailMessage).findBy({ kind: 'password-changed' });
    expect(notices).toHaveLength(1);
    expect(notices[0].toAddress).toBe(email);
    expect(notices[0].body).toMatch(/other open session was signed out/);
    // The notice never carries the password, old or new.
    expect(notices[0].body).not.toContain(NEW_PASSWORD);
    expect(notices[0].body).not.toContain(DEMO_PASSWORD);
  });

  it('takes a 100-character passphrase with spaces and capitals, and checks it exactly as typed', async () => {
    // ASVS 5.0 §6.2.9 (at least 64 characters allowed) and §6.2.8 (no truncation, trimming or case change).
    const passphrase = `  Harbour Light ${'tide '.repeat(16)}End `;
    expect(passphrase.length).toBe(100);
    const email = demoEmail('governance');
    const client = await signedInAs(t.app, 'governance');
    expect((await client.post('/api/auth/password', { currentPassword: DEMO_PASSWORD, newPassword: passphrase })).status).toBe(200);

    for (const altered of [passphrase.trim(), passphrase.toLowerCase(), passphrase.slice(0, 72), passphrase.slice(0, -1)]) {
      expect((await new ApiClient(t.app).signIn(email, altered)).status).toBe(401);
    }
    expect((await new ApiClient(t.app).signIn(email, passphrase)).status).toBe(200);
  });

  it('refuses a wrong current password with a field error, and changes nothing', async () => {
    const email = demoEmail('partner');
    const before = await passwordHashOf(t, email);
    const client = await signedInAs(t.app, 'partner');
    const other = await signedInAs(t.app, 'partner');

    const response = await client.post('/api/auth/password', { currentPassword: 'not-the-password-at-all', newPassword: NEW_PASSWORD });
    expect(response.status).toBe(400);
    expect(response.body.error.fields).toEqual({ currentPassword: 'This is not your current password.' });
    expect(await passwordHashOf(t, email)).toBe(before);
    expect((await other.get('/api/auth/me')).status).toBe(200);
    expect(await t.dataSource.getRepository(MailMessage).countBy({ kind: 'password-changed' })).toBe(0);
  });

  it.each([
    ['a new password under 12 characters (ASVS 6.2.1)', { currentPassword: DEMO_PASSWORD, newPassword: 'short-1' }, 'newPassword', /at least 12/],
    ['the same password again', { currentPassword: DEMO_PASSWORD, newPassword: DEMO_PASSWORD }, 'newPassword', /different from the current/],
    ['a common password (zxcvbn-ts common-password list, ASVS 6.2.4)', { currentPassword: DEMO_PASSWORD, newPassword: 'password1234' }, 'newPassword', /common passwords/],
    ['no current password', { newPassword: NEW_PASSWORD }, 'currentPassword', /Enter your current password/],
    ['a password of context words only (ASVS 6.2.11, server/auth/context-words.ts)', { currentPassword: DEMO_PASSWORD, newPassword: 'Gingiva-Crown-Tidemark-2026' }, 'newPassword', /words anyone would try here/],
    ['a password of the member’s own name and e-mail only', { currentPassword: DEMO_PASSWORD, newPassword: 'lead-example-org-2026!' }, 'newPassword', /words anyone would try here/],
  ])('refuses %s with a field error and changes nothing', async (_label, body, field, message) => {
    const email = demoEmail('audit_lead');
    const before = await passwordHashOf(t, email);
    const client = await signedInAs(t.app, 'audit_lead');
    const response = await client.post('/api/auth/password', body);
    expect(response.status).toBe(400);
    expect(response.body.error.fields[field]).toMatch(message);
    expect(await passwordHashOf(t, email)).toBe(before);
  });

  it('is for signed-in members only, and needs the CSRF token', async () => {
    const anonymous = new ApiClient(t.app);
    expect((await anonymous.post('/api/auth/password', { currentPassword: DEMO_PASSWORD, newPassword: NEW_PASSWORD })).status).toBe(401);

    const client = await signedInAs(t.app, 'governance');
    const before = await passwordHashOf(t, demoEmail('governance'));
    const forged = await client.agent.post('/api/auth/password').send({ currentPassword: DEMO_PASSWORD, newPassword: NEW_PASSWORD });
    expect(forged.status).toBe(403);
    expect(await passwordHashOf(t, demoEmail('governance'))).toBe(before);
  });

  it('stops guessing through a borrowed session after 5 refused attempts in 15 minutes, even with the right password', async () => {
    // The production limit (test apps otherwise lift it so that suites can send many bodies).
    await t.close();
    t = await createTestApp({ passwordChangeLimits: DEFAULT_PASSWORD_CHANGE_LIMITS });
    const client = await signedInAs(t.app, 'admin');
    for (let attempt = 1; attempt <= 5; attempt++) {
      expect((await client.post('/api/auth/password', { currentPassword: `guess-number-${attempt}`, newPassword: NEW_PASSWORD })).status).toBe(400);
    }
    const blocked = await client.post('/api/auth/password', { currentPassword: DEMO_PASSWORD, newPassword: NEW_PASSWORD });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe('rate_limited');
    expect((await new ApiClient(t.app).signIn(demoEmail('admin'), DEMO_PASSWORD)).status).toBe(200);
    // The limit is per member: a colleague is not held up by it.
    const colleague = await signedInAs(t.app, 'partner');
    expect((await colleague.post('/api/auth/password', { currentPassword: DEMO_PASSWORD, newPassword: NEW_PASSWORD })).status).toBe(200);
  });
});
