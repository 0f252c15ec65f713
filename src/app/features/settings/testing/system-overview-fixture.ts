import type { SystemOverview } from '@tidemark/shared';

/** An overview as the server answers it for a SQLite installation with SMTP mail and photographs in the data folder (specs only). */
export const SYSTEM_OVERVIEW: SystemOverview = {
  appVersion: '0.1.0',
  isDemo: false,
  database: { kind: 'sqlite', fileName: 'tidemark.sqlite', fileBytes: 48_300_000, walBytes: 1_200_000, journalMode: 'wal' },
  schema: { latestMigration: 'SecondFactor1765200000000', appliedCount: 5, knownCount: 5, isUpToDate: true },
  photoStorage: { kind: 'data-folder' },
  mail: { kind: 'smtp', host: 'smtp.example.org', port: 587, isEncrypted: false, hasSignIn: true, from: 'Tidemark <no-reply@example.org>' },
  signIn: { secondFactorPolicy: 'required', requiredRoles: ['admin', 'audit_lead'], sessionIdleMinutes: 30, sessionAbsoluteMinutes: 480 },
  backups: {
    isAvailable: true,
    dailyKept: 7,
    files: [
      { name: 'tidemark-20260302T020000Z.sqlite', kind: 'daily', bytes: 48_100_000, takenAt: '2026-03-02T02:00:00.000Z' },
      { name: 'tidemark-20260301T163000Z.sqlite', kind: 'manual', bytes: 47_900_000, takenAt: '2026-03-01T16:30:00.000Z' },
    ],
  },
};
