import { ROLE_LABELS, type BackupFile, type MailOverview, type PhotoStorageOverview, type SchemaOverview, type SignInOverview } from '@tidemark/shared';

/** Said where the server's start did not report a part of the installation. */
export const NOT_REPORTED = 'Not reported by this server. It is set where the server is started (see the README).';

/** A duration in whole minutes as people say it: "30 minutes", "8 hours", "1 hour 30 minutes". */
export function durationInWords(minutes: number): string {
  const hours = Math.floor(minutes / 60);
  const rest = minutes % 60;
  const hourWords = hours === 0 ? '' : `${hours} ${hours === 1 ? 'hour' : 'hours'}`;
  const minuteWords = rest === 0 ? '' : `${rest} ${rest === 1 ? 'minute' : 'minutes'}`;
  return [hourWords, minuteWords].filter(Boolean).join(' ') || '0 minutes';
}

/** Who must use one-time codes, in a sentence. */
export function secondFactorRule(signIn: SignInOverview): string {
  if (signIn.secondFactorPolicy === 'offered') {
    return 'Offered to everyone and required of no one: each person chooses under Sign-in protection. Demo mode works this way so the demo accounts sign in with a password alone.';
  }
  const roles = signIn.requiredRoles.map((role) => `${ROLE_LABELS[role].toLocaleLowerCase()}s`);
  const who = roles.length > 1 ? `${roles.slice(0, -1).join(', ')} and ${roles.at(-1)}` : (roles[0] ?? 'no role');
  return `Required of ${who}, who set codes up at their first sign-in; offered to everyone else.`;
}

/** The two session limits in one sentence. */
export function sessionLimitsRule(signIn: SignInOverview): string {
  return `Signed out after ${durationInWords(signIn.sessionIdleMinutes)} without activity, and ${durationInWords(signIn.sessionAbsoluteMinutes)} after signing in however busy.`;
}

/** Where photographs are kept, in a sentence. */
export function photoStorageSummary(storage: PhotoStorageOverview): string {
  if (!storage) return NOT_REPORTED;
  if (storage.kind === 'data-folder') {
    return 'In the uploads folder of the data folder on this server, outside anything the web server serves.';
  }
  const place = storage.endpoint ? `the object store at ${storage.endpoint}` : `Amazon S3 (${storage.region})`;
  return `In bucket “${storage.bucket}”${storage.prefix ? `, folder “${storage.prefix}”` : ''}, on ${place}. Objects are private and only served through Tidemark.`;
}

/** Whether backups hold the photographs, in a sentence (server/maintenance/backup-photos.ts). */
export function backupPhotosNote(storage: PhotoStorageOverview): string {
  if (!storage) return 'Whether it includes the photographs depends on where they are kept, which this server did not report.';
  if (storage.kind === 'data-folder') {
    return 'The photographs it refers to are kept beside it, in a folder of the same name ending in “-photos”, linked rather than copied where the disk allows; copy the backups folder to another machine to survive a disk loss.';
  }
  return 'Photographs are not in it: they are kept in object storage, whose own versioning keeps their history.';
}

/** How Tidemark sends e-mail, in a sentence. */
export function mailSummary(mail: MailOverview): string {
  if (!mail) return NOT_REPORTED;
  if (mail.kind === 'stand-in') {
    return 'Kept on this server: a local stand-in catches every message in the outbox folder, and nothing leaves the machine. Set SMTP_HOST to send for real.';
  }
  const security = mail.isEncrypted ? 'encrypted from the first byte' : 'upgraded to TLS when the server offers it';
  const signIn = mail.hasSignIn ? 'with a mail account' : 'without a mail account';
  return `Through ${mail.host}, port ${mail.port}, ${security}, ${signIn}.`;
}

/** The schema's state, in a sentence. */
export function schemaSummary(schema: SchemaOverview): string {
  const steps = `${schema.appliedCount} of ${schema.knownCount} schema steps applied`;
  return schema.isUpToDate ? `Up to date (${steps}).` : `Behind this version of Tidemark (${steps}). Restart the server to bring it up to date.`;
}

/** Who took a backup, in words. */
export const BACKUP_KIND_LABELS: Readonly<Record<BackupFile['kind'], string>> = {
  manual: 'On request',
  daily: 'Daily round',
};
