import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Express } from 'express';
import request, { type Response } from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import type { DataSource } from 'typeorm';
import type { DestinationStream } from 'pino';
import type { Role, SecondFactorPolicy } from '@tidemark/shared';
import { createApp, type TidemarkApp } from '../../../server/app';
import nodemailer, { type Transporter } from 'nodemailer';
import { LocalPhotoStorage, type PhotoStorage } from '../../../server/storage/photo-storage';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../../server/demo/demo-accounts';
import type { LoginLimits } from '../../../server/routes/auth.routes';
import type { PasswordChangeLimits } from '../../../server/routes/password.routes';
import type { InstallationFacts } from '../../../server/services/system-overview.service';
import { openTestDatabase } from './test-database';

/** The session and CSRF signing secret of every test app (secret scans look for it in answers). */
export const TEST_SECRET = 'test-secret-that-is-long-enough-for-hmac-0123456789';

/** A cheap scrypt cost for tests only; production keeps OWASP's N = 2^17. */
export const TEST_SCRYPT_COST = { N: 2 ** 10, r: 8, p: 1 };

/** An in-process app on a throwaway database (migrated, not synchronised). */
export interface TestApp extends TidemarkApp {
  dataSource: DataSource;
  dataDir: string;
  close(): Promise<void>;
}

/** Builds the app on a fresh migrated database (a temporary SQLite file, or PostgreSQL under TIDEMARK_TEST_PG_URL) with the demo accounts. */
export async function createTestApp(options: { loginLimits?: LoginLimits; passwordChangeLimits?: PasswordChangeLimits; trustProxy?: boolean; isHttpsOnly?: boolean; mailTransport?: Transporter; photoStorage?: PhotoStorage; secondFactor?: SecondFactorPolicy; clock?: () => number; installation?: InstallationFacts; log?: { level: string; destination: DestinationStream } } = {}): Promise<TestApp> {
  const dataDir = mkdtempSync(path.join(tmpdir(), 'tidemark-test-'));
  const database = await openTestDatabase(dataDir);
  const dataSource = database.dataSource;
  const built = createApp({
    dataSource,
    secret: TEST_SECRET,
    clientDir: null,
    photoStorage: options.photoStorage ?? new LocalPhotoStorage(path.join(dataDir, 'uploads')),
    exportsDir: path.join(dataDir, 'exports'),
    // No network by default: nodemailer's JSON transport; mail tests pass the SMTP stand-in.
    mail: { transport: options.mailTransport ?? nodemailer.createTransport({ jsonTransport: true }), from: 'Tidemark <no-reply@example.org>', appUrl: 'http://localhost:3000' },
    scryptCost: TEST_SCRYPT_COST,
    loginLimits: options.loginLimits ?? { perAccount: 1000, perAddress: 1000, windowMs: 60_000 },
    passwordChangeLimits: options.passwordChangeLimits ?? { perMember: 1000, windowMs: 60_000 },
    // Silent unless a test reads the log lines (test/api/security/security-log.api.spec.ts).
    logLevel: options.log?.level ?? 'silent',
    logDestination: options.log?.destination,
    trustProxy: options.trustProxy,
    isHttpsOnly: options.isHttpsOnly,
    // Most suites sign in as admin or audit lead with a password only; second-factor tests pass 'required'.
    secondFactor: options.secondFactor ?? 'offered',
    clock: options.clock,
    // What the Settings page reports; the backups folder defaults to <dataDir>/backups.
    installation: options.installation,
  });
  for (const account of DEMO_ACCOUNTS) await built.users.ensure({ ...account, password: DEMO_PASSWORD });
  return {
    ...built,
    dataSource,
    dataDir,
    async close() {
      await database.close();
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

/** Reads one cookie's value from a response's Set-Cookie headers. */
export function cookieFrom(response: Response, name: string): string | undefined {
  const header = response.headers['set-cookie'] as unknown;
  const cookies = Array.isArray(header) ? (header as string[]) : [];
  const line = cookies.find((cookie) => cookie.startsWith(`${name}=`));
  return line?.slice(name.length + 1).split(';')[0];
}

/** The full Set-Cookie line for one cookie (to check its flags). */
export function setCookieLine(response: Response, name: string): string | undefined {
  const header = response.headers['set-cookie'] as unknown;
  const cookies = Array.isArray(header) ? (header as string[]) : [];
  return cookies.find((cookie) => cookie.startsWith(`${name}=`));
}

/**
 * A browser-like client: keeps cookies (supertest agent) and echoes the XSRF-TOKEN
 * cookie in the X-XSRF-TOKEN header on writes, as Angular's HttpClient does.
 */
export class ApiClient {
  readonly agent: TestAgent;
  xsrf = '';
  /** Raw value of the session cookie as last set by the server. */
  sessionCookie = '';

  constructor(app: Express) {
    this.agent = request.agent(app);
  }

  private track(response: Response): Response {
    this.xsrf = cookieFrom(response, 'XSRF-TOKEN') ?? this.xsrf;
    this.sessionCookie = cookieFrom(response, 'tm.sid') ?? this.sessionCookie;
    return response;
  }

  /** The session id inside the signed cookie (`s:<sid>.<signature>`). */
  sessionId(): string {
    const value = decodeURIComponent(this.sessionCookie);
    if (!value.startsWith('s:')) throw new Error('No session cookie yet.');
    return value.slice(2, value.lastIndexOf('.'));
  }

  async get(url: string): Promise<Response> {
    return this.track(await this.agent.get(url));
  }

  /** A GET whose answer is read whole into a Buffer body (photographs, workbooks). */
  async getBytes(url: string, headers: Record<string, string> = {}): Promise<Response> {
    const response = await this.agent
      .get(url)
      .set(headers)
      .buffer(true)
      .parse((res, callback) => {
        const chunks: Buffer[] = [];
        res.on('data', (chunk: Buffer) => chunks.push(chunk));
        res.on('end', () => callback(null, Buffer.concat(chunks)));
      });
    return this.track(response);
  }

  async send(method: 'post' | 'put' | 'patch' | 'delete', url: string, body?: object): Promise<Response> {
    if (!this.xsrf) await this.get('/api/auth/me');
    const pending = this.agent[method](url).set('X-XSRF-TOKEN', this.xsrf);
    return this.track(await (body === undefined ? pending : pending.send(body)));
  }

  post(url: string, body?: object): Promise<Response> {
    return this.send('post', url, body);
  }

  patch(url: string, body?: object): Promise<Response> {
    return this.send('patch', url, body);
  }

  delete(url: string): Promise<Response> {
    return this.send('delete', url);
  }

  /**
   * A multipart POST as the photo form sends it: text fields plus an optional file in
   * field `file` with the given file name and declared content type.
   */
  async upload(url: string, fields: Record<string, string>, file?: { bytes: Buffer; filename: string; contentType?: string }): Promise<Response> {
    if (!this.xsrf) await this.get('/api/auth/me');
    let pending = this.agent.post(url).set('X-XSRF-TOKEN', this.xsrf);
    for (const [name, value] of Object.entries(fields)) pending = pending.field(name, value);
    if (file) pending = pending.attach('file', file.bytes, { filename: file.filename, contentType: file.contentType ?? 'image/jpeg' });
    return this.track(await pending);
  }

  async signIn(email: string, password = DEMO_PASSWORD): Promise<Response> {
    return this.post('/api/auth/login', { email, password });
  }
}

/** The demo e-mail address for a role. */
export function demoEmail(role: Role): string {
  const account = DEMO_ACCOUNTS.find((candidate) => candidate.role === role);
  if (!account) throw new Error(`No demo account for ${role}`);
  return account.email;
}

/** A client already signed in as the demo account of `role`. */
export async function signedInAs(app: Express, role: Role): Promise<ApiClient> {
  const client = new ApiClient(app);
  const response = await client.signIn(demoEmail(role));
  if (response.status !== 200) throw new Error(`Sign-in as ${role} failed: ${response.status} ${JSON.stringify(response.body)}`);
  return client;
}
