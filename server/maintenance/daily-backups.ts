import { rmSync } from 'node:fs';
import path from 'node:path';
import type { PhotoStorageConfig } from '../storage/create-photo-storage';
import { describePhotoBackup, photoFolderOf } from './backup-photos';
import { backupDatabase, listBackups, type BackupResult } from './database-backup';

const HOUR_MS = 60 * 60 * 1000;
const DAY_MS = 24 * HOUR_MS;

/** Options of {@link startDailyBackups}. */
export interface DailyBackupOptions {
  databaseFile: string;
  /** `<dataDir>/backups`; daily backups go to its `daily/` folder, apart from manual ones. */
  backupsDir: string;
  /** How many daily backups to keep (the newest). */
  keep: number;
  /** Where photographs live; the uploads folder's are captured with each backup (see `backupDatabase`). */
  photoStorage?: PhotoStorageConfig | null;
  /** How often to look whether a day has passed since the last one. */
  checkEveryMs?: number;
  /** Delay of the first look after start. */
  firstCheckAfterMs?: number;
  now?: () => Date;
  log?: (message: string) => void;
  logError?: (error: unknown) => void;
}

/**
 * Deletes all but the newest `keep` backups of a folder, each with its photo folder (names as
 * `backupDatabase` writes them; other files are left alone). The photo folder goes first: a crash
 * in between leaves a database without photographs named as an old database-only backup would
 * be, never a photo folder nobody lists.
 *
 * @returns the database files deleted
 */
export function pruneBackups(folder: string, keep: number): string[] {
  const backups = listBackups(folder);
  const surplus = backups.slice(0, Math.max(0, backups.length - keep)).map((backup) => backup.file);
  for (const file of surplus) {
    rmSync(photoFolderOf(file), { recursive: true, force: true });
    rmSync(file, { force: true });
  }
  return surplus;
}

/**
 * Takes a backup into `<backupsDir>/daily` when the newest there is a day old (or there is none),
 * then keeps only the newest `keep`. Looking hourly rather than firing every 24 hours means a
 * server restarted often still backs up once a day, and never twice.
 *
 * @returns the backup taken, or null when the last one is less than a day old
 */
export async function takeDailyBackupIfDue(options: DailyBackupOptions): Promise<BackupResult | null> {
  const folder = path.join(options.backupsDir, 'daily');
  const now = options.now?.() ?? new Date();
  const newest = listBackups(folder).at(-1);
  if (newest && now.getTime() - newest.takenAt.getTime() < DAY_MS) return null;
  const backup = await backupDatabase({ databaseFile: options.databaseFile, backupsDir: folder, at: now, photoStorage: options.photoStorage });
  pruneBackups(folder, options.keep);
  return backup;
}

/**
 * Starts the daily backups of a running server (timers are unref'd: they never keep the process
 * alive). Does nothing when `keep` is 0.
 *
 * @returns a function that stops them
 */
export function startDailyBackups(options: DailyBackupOptions): () => void {
  if (options.keep <= 0) return () => undefined;
  const log = options.log ?? ((message: string) => console.log(message));
  const logError = options.logError ?? ((error: unknown) => console.error('Daily backup failed:', error));
  let isRunning = false;
  const check = (): void => {
    if (isRunning) return;
    isRunning = true;
    takeDailyBackupIfDue(options)
      .then((backup) => {
        if (backup) log([`Daily backup written: ${backup.file} (${backup.bytes} bytes, integrity ok).`, ...describePhotoBackup(backup.photos)].join(' '));
      })
      .catch(logError)
      .finally(() => {
        isRunning = false;
      });
  };
  const timer = setInterval(check, options.checkEveryMs ?? HOUR_MS);
  timer.unref();
  const first = setTimeout(check, options.firstCheckAfterMs ?? 60_000);
  first.unref();
  return () => {
    clearInterval(timer);
    clearTimeout(first);
  };
}
