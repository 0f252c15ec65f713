import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { Secret } from 'otpauth';
import { totpCode } from '../../server/auth/totp';
import { ApiClient, createTestApp, demoEmail, signedInAs, TEST_SECRET, type TestApp } from '../api/support/test-app';
import { withDatabase } from './support/database-checks';
import { runTsxScript, type ScriptRun } from './support/tsx-script';

/*
 * `npm run reset-sign-in -- <e-mail>` run as users run it (a child process on the data dir),
 * against a database seeded by the app itself: members enrolled and signed in through the API,
 * which stays open meanwhile as a running server would.
 */

const SCRIPT = 'server/cli/reset-sign-in.ts';
/** A moment at the start of a 30-second TOTP step (RFC 6238 §4.2, X = 30 s); the app's clock. */
const STEP_START = 58_920_000 * 30_000;
const STEP_MS = 30_000;

describe('npm run reset-sign-in', () => {
  let t: TestApp;
  let now = STEP_START;
  let database: string;
  const ids = new Map<string, number>();
  /** Live clients, to see from the app's side whose sessions ended. */
  const clients = new Map<string, ApiClient>();

  /** Runs the command on the test app's data dir, as the production policy (codes required) would. */
  const run = (args: string[], env: Record<string, string> = {}): Promise<ScriptRun> =>
    runTsxScript(SCRIPT, args, { TIDEMARK_DATA_DIR: t.dataDir, TIDEMARK_SECRET: TEST_SECRET, TIDEMARK_DEMO: 'off', DATABASE_URL: '', ...env });

  /** Every row the command could touch, as stored. */
  const fingerprint = (): Record<string, unknown[]> =>
    withDatabase(database, (db) =>
      Object.fromEntries(['"user"', 'user_second_factor', 'recovery_code', 'session', 'change_record'].map((table) => [table, db.prepare(`SELECT * FROM ${table} ORDER BY 1`).all()])),
    );

  const count = (sql: string, ...values: number[]): number => withDatabase(database, (db) => Number(db.prepare<number[], { n: number }>(sql).get(...values)?.n));
  const sessionsOf = (email: string): number => count('SELECT COUNT(*) AS n FROM session WHERE user_id = ?', ids.get(email) ?? -1);
  const factorRowsOf = (email: string): number => count('SELECT COUNT(*) AS n FROM user_second_factor WHERE user_id = ?', ids.get(email) ?? -1);
  const recoveryCodesOf = (email: string): number => count('SELECT COUNT(*) AS n FROM recovery_code WHERE user_id = ?', ids.get(email) ?? -1);

  /** A refusal: its exit code, one line on stderr matching `message`, nothing on stdout, no stack trace, no change. */
  const expectRefusal = async (args: string[], code: number, message: RegExp, env: Record<string, string> = {}): Promise<void> => {
    const before = fingerprint();
    const result = await run(args, env);
    expect({ code: result.code, stdout: result.stdout }).toEqual({ code, stdout: '' });
    expect(result.stderr).toMatch(message);
    expect(result.stderr.trim().split('\n')).toHaveLength(1);
    expect(result.stderr).not.toMatch(/^\s+at /m);
    expect(fingerprint()).toEqual(before);
  };

  /** Signs in with the password and enrols one-time codes through the API; returns the client (its session verified). */
  const enrolled = async (email: string): Promise<{ client: ApiClient; secret: Uint8Array }> => {
    const client = new ApiClient(t.app);
    expect((await client.signIn(email)).body.secondFactor).toBe('enrolment-required');
    const started = await client.post('/api/auth/second-factor/enrolment');
    const secret = Secret.fromBase32(started.body.secret).bytes;
    expect((await client.post('/api/auth/second-factor/enrolment/confirm', { code: totpCode(secret, now) })).status).toBe(200);
    return { client, secret };
  };

  beforeAll(async () => {
    t = await createTestApp({ secondFactor: 'required', clock: () => now });
    database = path.join(t.dataDir, 'tidemark.sqlite');
    for (const role of ['admin', 'audit_lead', 'clinician', 'partner'] as const) {
      const email = demoEmail(role);
      ids.set(email, (await t.dataSource.query('SELECT id FROM "user" WHERE email = ?', [email]))[0].id as number);
    }
    const admin = await enrolled('admin@example.org');
    clients.set('admin@example.org', admin.client);
    // A second session of the administrator's, signed in with a code of the next step (a code works once).
    now += STEP_MS;
    const secondAdmin = new ApiClient(t.app);
    await secondAdmin.signIn('admin@example.org');
    expect((await secondAdmin.post('/api/auth/second-factor/verify', { method: 'one-time-code', code: totpCode(admin.secret, now) })).status).toBe(200);
    clients.set('admin@example.org#2', secondAdmin);
    clients.set('lead@example.org', (await enrolled('lead@example.org')).client);
    clients.set('clinician@example.org', await signedInAs(t.app, 'clinician'));
    clients.set('partner@example.org', await signedInAs(t.app, 'partner'));
  });

  afterAll(async () => {
    await t.close();
  });

  it('seeds what the checks rely on: two members with codes, every member signed in', async () => {
    expect({ factor: factorRowsOf('admin@example.org'), codes: recoveryCodesOf('admin@example.org'), sessions: sessionsOf('admin@example.org') }).toEqual({ factor: 1, codes: 10, sessions: 2 });
    expect({ factor: factorRowsOf('lead@example.org'), codes: recoveryCodesOf('lead@example.org'), sessions: sessionsOf('lead@example.org') }).toEqual({ factor: 1, codes: 10, sessions: 1 });
    expect([sessionsOf('clinician@example.org'), sessionsOf('partner@example.org'), factorRowsOf('partner@example.org')]).toEqual([1, 1, 0]);
    for (const client of clients.values()) expect((await client.get('/api/auth/me')).status).toBe(200);
  });

  it('refuses usage errors with exit code 2: no e-mail, two e-mails, and a --password option', async () => {
    await expectRefusal([], 2, /^Usage: npm run reset-sign-in -- <e-mail>/);
    await expectRefusal(['admin@example.org', 'lead@example.org'], 2, /^Usage: npm run reset-sign-in -- <e-mail>/);
    await expectRefusal(['--password', 'admin@example.org'], 2, /^Unknown option --password: this command only resets a member’s second factor\./);
  }, 60_000);

  it('refuses an e-mail no member has, with exit code 1', async () => {
    await expectRefusal(['nobody@example.org'], 1, /^No member with the e-mail nobody@example\.org\. Nothing was changed\.$/m);
  });

  it('refuses with exit code 1 when there is no database, and does not create one', async () => {
    const empty = mkdtempSync(path.join(tmpdir(), 'tidemark-reset-none-'));
    try {
      await expectRefusal(['admin@example.org'], 1, /^No database at .*tidemark-reset-none-.*tidemark\.sqlite: check TIDEMARK_DATA_DIR/, { TIDEMARK_DATA_DIR: empty });
      expect(readdirSync(empty).filter((name) => name.startsWith('tidemark.sqlite'))).toEqual([]);
    } finally {
      rmSync(empty, { recursive: true, force: true });
    }
  });

  it('refuses with exit code 1 a SQLite file that is not a Tidemark database at this version', async () => {
    const other = mkdtempSync(path.join(tmpdir(), 'tidemark-reset-other-'));
    try {
      const db = new Database(path.join(other, 'tidemark.sqlite'));
      db.exec('CREATE TABLE "user" (id INTEGER PRIMARY KEY, email TEXT)');
      db.prepare('INSERT INTO "user" (email) VALUES (?)').run('admin@example.org');
      db.close();
      await expectRefusal(['admin@example.org'], 1, /is not a Tidemark database at this version's schema: start the server \(or run npm run migrate\) first\. Nothing was changed\./, { TIDEMARK_DATA_DIR: other });
      expect(withDatabase(path.join(other, 'tidemark.sqlite'), (db) => db.prepare('SELECT name FROM sqlite_master ORDER BY name').all())).toEqual([{ name: 'user' }]);
    } finally {
      rmSync(other, { recursive: true, force: true });
    }
  });

  it('says a member without a second factor has nothing to reset, exits 0 and changes nothing', async () => {
    const before = fingerprint();
    const result = await run(['partner@example.org']);
    expect({ code: result.code, stderr: result.stderr }).toEqual({ code: 0, stderr: '' });
    expect(result.stdout).toBe('partner@example.org (partner) has no second factor set up: nothing to reset, nothing was changed.\n');
    expect(fingerprint()).toEqual(before);
    expect((await clients.get('partner@example.org')?.get('/api/auth/me'))?.status).toBe(200);
  });

  it("removes the administrator's codes and ends only their sessions, while the server runs", async () => {
    const leadBefore = withDatabase(database, (db) => db.prepare('SELECT * FROM user_second_factor WHERE user_id = ?').all(ids.get('lead@example.org')));
    // Typed as someone might: e-mail addresses are stored lower-cased (user.entity.ts).
    const result = await run(['Admin@Example.ORG']);
    expect({ code: result.code, stderr: result.stderr }).toEqual({ code: 0, stderr: '' });
    expect(result.stdout).toBe(
      'Sign-in protection reset for admin@example.org (admin): one-time and recovery codes removed, 2 sessions ended; they set up one-time codes again at their next sign-in.\n',
    );

    expect({ factor: factorRowsOf('admin@example.org'), codes: recoveryCodesOf('admin@example.org'), sessions: sessionsOf('admin@example.org') }).toEqual({ factor: 0, codes: 0, sessions: 0 });
    expect(withDatabase(database, (db) => db.prepare('SELECT * FROM user_second_factor WHERE user_id = ?').all(ids.get('lead@example.org')))).toEqual(leadBefore);
    expect([recoveryCodesOf('lead@example.org'), sessionsOf('lead@example.org'), sessionsOf('clinician@example.org'), sessionsOf('partner@example.org')]).toEqual([10, 1, 1, 1]);

    // The running app sees it at once: the administrator's two sessions are gone, the others carry on.
    for (const key of ['admin@example.org', 'admin@example.org#2']) expect((await clients.get(key)?.get('/api/auth/me'))?.status).toBe(401);
    for (const key of ['lead@example.org', 'clinician@example.org', 'partner@example.org']) expect((await clients.get(key)?.get('/api/auth/me'))?.status).toBe(200);
    // The way back in: the password alone, then setting up codes again, as the role requires.
    const again = await new ApiClient(t.app).signIn('admin@example.org');
    expect(again.status).toBe(200);
    expect(again.body.secondFactor).toBe('enrolment-required');
  });

  it('run a second time, finds nothing to reset (exit 0, nothing changed)', async () => {
    const before = fingerprint();
    const result = await run(['admin@example.org']);
    expect(result.code).toBe(0);
    expect(result.stdout).toBe('admin@example.org (admin) has no second factor set up: nothing to reset, nothing was changed.\n');
    expect(fingerprint()).toEqual(before);
  });
});
