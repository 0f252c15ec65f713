import * as z from 'zod';
import { ROLES } from '../types/role';

/*
 * `GET /api/settings/system` and `POST /api/settings/backups` (administrator only): how this
 * installation keeps its records, photographs and mail, and its backups. Every object is strict,
 * so a field the server adds by mistake (a password, a connection string) fails the shared check
 * instead of reaching the page.
 */

/** Where the records live: the SQLite file, or a PostgreSQL server (never its address with credentials). */
export const databaseOverviewSchema = z.discriminatedUnion('kind', [
  z.strictObject({
    kind: z.literal('sqlite'),
    fileName: z.string().describe('Name of the database file in the data folder'),
    fileBytes: z.number().int().nonnegative().describe('Size of the database file'),
    walBytes: z.number().int().nonnegative().describe('Size of the write-ahead log beside it (recent commits not yet folded in)'),
    journalMode: z.string().describe('SQLite journal mode, `wal` when healthy'),
  }),
  z.strictObject({
    kind: z.literal('postgres'),
    host: z.string().describe('Server host and port, without user or password'),
    database: z.string().describe('Database name'),
    serverVersion: z.string().nullable(),
  }),
]);
export type DatabaseOverview = z.infer<typeof databaseOverviewSchema>;

/** How far the database schema has been brought (TypeORM migrations). */
export const schemaOverviewSchema = z.strictObject({
  latestMigration: z.string().nullable().describe('Name of the newest migration applied'),
  appliedCount: z.number().int().nonnegative(),
  knownCount: z.number().int().nonnegative().describe('Migrations this version of Tidemark ships'),
  isUpToDate: z.boolean(),
});
export type SchemaOverview = z.infer<typeof schemaOverviewSchema>;

/** Where photographs are kept; null when the server start did not say. */
export const photoStorageOverviewSchema = z
  .discriminatedUnion('kind', [
    z.strictObject({ kind: z.literal('data-folder') }),
    z.strictObject({
      kind: z.literal('object-storage'),
      bucket: z.string(),
      prefix: z.string(),
      region: z.string(),
      endpoint: z.string().nullable().describe('Scheme and host of a non-AWS store, never user information'),
    }),
  ])
  .nullable();
export type PhotoStorageOverview = z.infer<typeof photoStorageOverviewSchema>;

/** How Tidemark sends e-mail; null when the server start did not say. */
export const mailOverviewSchema = z
  .discriminatedUnion('kind', [
    z.strictObject({ kind: z.literal('stand-in'), from: z.string() }),
    z.strictObject({
      kind: z.literal('smtp'),
      host: z.string(),
      port: z.number().int(),
      isEncrypted: z.boolean().describe('TLS from the first byte (SMTP_SECURE)'),
      hasSignIn: z.boolean().describe('A user name and password are configured (neither is reported)'),
      from: z.string(),
    }),
  ])
  .nullable();
export type MailOverview = z.infer<typeof mailOverviewSchema>;

/** Sign-in rules in force. */
export const signInOverviewSchema = z.strictObject({
  secondFactorPolicy: z.enum(['required', 'offered']),
  /** Roles that must use one-time codes when the policy is `required`. */
  requiredRoles: z.array(z.enum(ROLES)),
  sessionIdleMinutes: z.number().int().positive(),
  sessionAbsoluteMinutes: z.number().int().positive(),
});
export type SignInOverview = z.infer<typeof signInOverviewSchema>;

/** Who took a backup: an administrator or `npm run backup` (`manual`), or the server's daily round (`daily`). */
export const BACKUP_KINDS = ['manual', 'daily'] as const;

/** One backup file. */
export const backupFileSchema = z.strictObject({
  name: z.string(),
  kind: z.enum(BACKUP_KINDS),
  bytes: z.number().int().nonnegative(),
  takenAt: z.iso.datetime(),
});
export type BackupFile = z.infer<typeof backupFileSchema>;

/** The backups folder. */
export const backupsOverviewSchema = z.strictObject({
  /** False on PostgreSQL: its own tools back it up. */
  isAvailable: z.boolean(),
  /** Daily backups the server keeps (0: none are taken). */
  dailyKept: z.number().int().nonnegative(),
  /** Newest first. */
  files: z.array(backupFileSchema),
});
export type BackupsOverview = z.infer<typeof backupsOverviewSchema>;

/** `GET /api/settings/system`. */
export const systemOverviewSchema = z.strictObject({
  appVersion: z.string(),
  isDemo: z.boolean(),
  database: databaseOverviewSchema,
  schema: schemaOverviewSchema,
  photoStorage: photoStorageOverviewSchema,
  mail: mailOverviewSchema,
  signIn: signInOverviewSchema,
  backups: backupsOverviewSchema,
});
export type SystemOverview = z.infer<typeof systemOverviewSchema>;

/** `POST /api/settings/backups` (201): the backup just taken and checked. */
export const backupTakenSchema = z.strictObject({
  name: z.string(),
  bytes: z.number().int().nonnegative(),
  takenAt: z.iso.datetime(),
  durationMs: z.number().int().nonnegative(),
});
export type BackupTaken = z.infer<typeof backupTakenSchema>;
