import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { isPostgresUrl } from './entities/column-types';
import { photoStorageConfig, type PhotoStorageConfig } from './storage/create-photo-storage';

/** Runtime settings, read once from the environment. */
export interface ServerConfig {
  port: number;
  dataDir: string;
  databaseFile: string;
  /** DATABASE_URL: a postgres:// address moves the data (and sessions) to PostgreSQL; unset keeps the SQLite file. */
  databaseUrl: string | null;
  uploadsDir: string;
  /** The uploads dir, or S3-compatible object storage when S3_BUCKET is set. */
  photoStorage: PhotoStorageConfig;
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
  /** `<dataDir>/backups`: `npm run backup` output, restore safety copies, and `daily/`. */
  backupsDir: string;
  /** TIDEMARK_DAILY_BACKUPS: daily automatic backups kept by the server (default 7; 0 turns them off). */
  dailyBackupsKept: number;
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

/** DATABASE_URL if it names PostgreSQL, null when unset; anything else is refused rather than ignored. */
function databaseUrl(fromEnv: string | undefined): string | null {
  if (!fromEnv) return null;
  if (!isPostgresUrl(fromEnv)) throw new Error(`DATABASE_URL must start with postgres:// or postgresql:// (unset it to use the SQLite file), got "${fromEnv.split(':')[0]}:…".`);
  return fromEnv;
}

/** Builds the configuration from `process.env` (PORT, TIDEMARK_DATA_DIR, TIDEMARK_SECRET, TIDEMARK_DEMO, LOG_LEVEL, TRUST_PROXY, DATABASE_URL, SMTP_*, MAIL_FROM, APP_URL, S3_*, TIDEMARK_DAILY_BACKUPS). */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): ServerConfig {
  const dataDir = path.resolve(env.TIDEMARK_DATA_DIR ?? path.join(projectRoot, 'data'));
  mkdirSync(dataDir, { recursive: true });
  const port = Number(env.PORT ?? 3000);
  if (!Number.isInteger(port) || port < 0 || port > 65535) throw new Error(`PORT must be a port number, got "${env.PORT}".`);
  const dailyBackupsKept = Number(env.TIDEMARK_DAILY_BACKUPS ?? 7);
  if (!Number.isInteger(dailyBackupsKept) || dailyBackupsKept < 0) throw new Error(`TIDEMARK_DAILY_BACKUPS must be a whole number (0 turns daily backups off), got "${env.TIDEMARK_DAILY_BACKUPS}".`);
  return {
    port,
    dataDir,
    databaseFile: path.join(dataDir, 'tidemark.sqlite'),
    databaseUrl: databaseUrl(env.DATABASE_URL),
    uploadsDir: path.join(dataDir, 'uploads'),
    photoStorage: photoStorageConfig(env, path.join(dataDir, 'uploads')),
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
    backupsDir: path.join(dataDir, 'backups'),
    dailyBackupsKept,
  };
}
