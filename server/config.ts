import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';

/** Runtime settings, read once from the environment. */
export interface ServerConfig {
  port: number;
  dataDir: string;
  databaseFile: string;
  uploadsDir: string;
  secret: string;
  clientDir: string;
  /** Seed demo accounts and the demo practice on an empty database. */
  isDemo: boolean;
  logLevel: string;
  trustProxy?: string;
  /** Outgoing mail; without SMTP_HOST the demo starts a local stand-in. */
  smtp: { host: string | null; port: number; secure: boolean; user: string | null; password: string | null };
  mailFrom: string;
  /** Base address used in e-mail links. */
  appUrl: string | null;
  outboxDir: string;
}

const projectRoot = path.resolve(path.dirname(new URL(import.meta.url).pathname), '..');

/** Reads the secret from the environment or from `<dataDir>/secret.key`, creating it once. */
function loadSecret(dataDir: string, fromEnv: string | undefined): string {
  if (fromEnv) return fromEnv;
  const file = path.join(dataDir, 'secret.key');
  if (existsSync(file)) return readFileSync(file, 'utf8').trim();
  const secret = randomBytes(48).toString('base64url');
  writeFileSync(file, secret, { mode: 0o600 });
  return secret;
}

/** Builds the configuration from `process.env` (PORT, TIDEMARK_DATA_DIR, TIDEMARK_SECRET, TIDEMARK_DEMO, LOG_LEVEL, TRUST_PROXY, SMTP_*, MAIL_FROM, APP_URL). */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): ServerConfig {
  const dataDir = path.resolve(env.TIDEMARK_DATA_DIR ?? path.join(projectRoot, 'data'));
  mkdirSync(dataDir, { recursive: true });
  const port = Number(env.PORT ?? 3000);
  if (!Number.isInteger(port) || port < 0 || port > 65535) throw new Error(`PORT must be a port number, got "${env.PORT}".`);
  return {
    port,
    dataDir,
    databaseFile: path.join(dataDir, 'tidemark.sqlite'),
    uploadsDir: path.join(dataDir, 'uploads'),
    secret: loadSecret(dataDir, env.TIDEMARK_SECRET),
    clientDir: path.join(projectRoot, 'dist', 'tidemark', 'browser'),
    isDemo: (env.TIDEMARK_DEMO ?? 'on') !== 'off',
    logLevel: env.LOG_LEVEL ?? 'info',
    trustProxy: env.TRUST_PROXY,
    smtp: {
      host: env.SMTP_HOST ?? null,
      port: Number(env.SMTP_PORT ?? 25),
      secure: env.SMTP_SECURE === 'true',
      user: env.SMTP_USER ?? null,
      password: env.SMTP_PASSWORD ?? null,
    },
    mailFrom: env.MAIL_FROM ?? 'Tidemark <no-reply@example.org>',
    appUrl: env.APP_URL ?? null,
    outboxDir: path.join(dataDir, 'outbox'),
  };
}
