import { existsSync, mkdirSync, readdirSync, renameSync, rmSync, statSync } from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';
import type { PhotoStorageConfig } from '../storage/create-photo-storage';
import { backupPhotos, photoFolderOf, type PhotoBackup } from './backup-photos';

/** A finished, verified backup. */
export interface BackupResult {
  /** Absolute path of the backup file. */
  file: string;
  /** Its size on disk. */
  bytes: number;
  /** Milliseconds the copy and its check took (the photographs included). */
  durationMs: number;
  /** The photographs the database refers to: captured beside it, or why not. */
  photos: PhotoBackup;
}

/** Names of backups made by {@link backupDatabase}: `tidemark-20261202T053000Z.sqlite` (`-2`, `-3` … within one second). */
const BACKUP_NAME = /^tidemark-(\d{8}T\d{6}Z)(?:-(\d+))?\.sqlite$/;

/**
 * Pages copied per step of SQLite's online backup: everything in one step. A step holds one read
 * transaction on the source, so the copy is a single snapshot; smaller steps would let another
 * connection's commit restart the copy from the first page (sqlite.org/c3ref/backup_finish.html),
 * which a busy server could keep doing. In WAL mode that read transaction blocks no writer.
 */
export const ALL_PAGES = 0x7fffffff;

/**
 * The UTC timestamp of a backup's name in ISO 8601 basic format.
 *
 * @example backupStamp(new Date('2026-12-02T05:30:00.123Z')) // '20261202T053000Z'
 */
export function backupStamp(at: Date): string {
  return at.toISOString().replace(/\.\d{3}Z$/, 'Z').replace(/[-:]/g, '');
}

/** `<backupsDir>/tidemark-<stamp>.sqlite`, with `-2`, `-3` … when a backup of the same second (or its photo folder) exists. */
export function nextBackupPath(backupsDir: string, at: Date, prefix = 'tidemark'): string {
  const stamp = backupStamp(at);
  for (let index = 1; ; index += 1) {
    const candidate = path.join(backupsDir, `${prefix}-${stamp}${index === 1 ? '' : `-${index}`}.sqlite`);
    const photos = photoFolderOf(candidate);
    if (![candidate, `${candidate}.partial`, photos, `${photos}.partial`].some((taken) => existsSync(taken))) return candidate;
  }
}

/** `PRAGMA integrity_check` of one database: 'ok', or SQLite's first problems joined. */
export function integrityOf(db: Database.Database): string {
  const rows = db.pragma('integrity_check', { simple: false }) as { integrity_check: string }[];
  return rows.map((row) => row.integrity_check).join('; ');
}

/**
 * Copies the open database `source` into `target` through SQLite's online backup API, never a
 * file copy: the copy is one consistent snapshot even while other connections write. The copy is
 * written under `<target>.partial`, switched to a rollback journal (one self-contained file that
 * opens anywhere without -wal/-shm companions), checked with `PRAGMA integrity_check` and only
 * then renamed to `target`, so a crash or a failed check never leaves a half backup under a real name.
 *
 * @param beforeRename runs on the checked, closed copy just before the rename (the photographs are
 *   captured there, so a backup under its real name always has its photo folder)
 * @returns the size of the finished copy in bytes
 * @throws {Error} when the copy fails its integrity check or `beforeRename` fails (the partial file is removed)
 */
export async function writeVerifiedCopy(source: Database.Database, target: string, beforeRename?: (checkedCopy: string) => Promise<void>): Promise<number> {
  mkdirSync(path.dirname(target), { recursive: true });
  const partial = `${target}.partial`;
  rmSync(partial, { force: true });
  try {
    await source.backup(partial, { progress: () => ALL_PAGES });
    const copy = new Database(partial, { fileMustExist: true });
    try {
      copy.pragma('journal_mode = DELETE');
      const integrity = integrityOf(copy);
      if (integrity !== 'ok') throw new Error(`The backup copy failed its integrity check: ${integrity}`);
    } finally {
      copy.close();
    }
    await beforeRename?.(partial);
    renameSync(partial, target);
  } finally {
    for (const leftover of [partial, `${partial}-wal`, `${partial}-shm`, `${partial}-journal`]) rmSync(leftover, { force: true });
  }
  return statSync(target).size;
}

/** Where and when {@link backupDatabase} writes. */
export interface BackupOptions {
  /** The live SQLite file (`<dataDir>/tidemark.sqlite`). */
  databaseFile: string;
  /** Folder of the backups (`<dataDir>/backups`); created when missing. */
  backupsDir: string;
  /** The time in the backup's name; now by default. */
  at?: Date;
  /**
   * Where photographs live: the uploads folder's are captured into `<backup name>-photos/`; with
   * object storage, or when not given, the backup holds the database only and says so.
   */
  photoStorage?: PhotoStorageConfig | null;
}

/**
 * Takes an online backup of the live database into `<backupsDir>/tidemark-<UTC stamp>.sqlite` and
 * verifies it (see {@link writeVerifiedCopy}). Safe while the server is serving: the server's
 * writers are not blocked (WAL) and the copy holds exactly the transactions committed when it began.
 * With photographs in the uploads folder, the files that copy refers to are then placed beside it
 * in `tidemark-<UTC stamp>-photos/` (hard links where possible; see `backup-photos.ts`).
 *
 * @throws {Error} when there is no database at `databaseFile`, or the copy is damaged
 * @example await backupDatabase({ databaseFile: 'data/tidemark.sqlite', backupsDir: 'data/backups' })
 */
export async function backupDatabase(options: BackupOptions): Promise<BackupResult> {
  const started = performance.now();
  if (!existsSync(options.databaseFile)) throw new Error(`There is no database at ${options.databaseFile}.`);
  const file = nextBackupPath(options.backupsDir, options.at ?? new Date());
  // The server's busy timeout: a checkpoint or a migration in progress is waited for, not failed on.
  const source = new Database(options.databaseFile, { fileMustExist: true, timeout: 5000 });
  try {
    let photos: PhotoBackup = { kind: 'not-reported' };
    const bytes = await writeVerifiedCopy(source, file, async (checkedCopy) => {
      photos = await backupPhotos(checkedCopy, photoFolderOf(file), options.photoStorage);
    });
    return { file, bytes, durationMs: Math.round(performance.now() - started), photos };
  } finally {
    source.close();
  }
}

/** One backup file found in a backups folder, oldest first by {@link listBackups}. */
export interface BackupEntry {
  file: string;
  /** The stamp of its name, e.g. 20261202T053000Z. */
  stamp: string;
  /** When it was taken (from its name). */
  takenAt: Date;
}

/** Parses `20261202T053000Z` back into a date. */
function stampDate(stamp: string): Date {
  const [, year, month, day, hour, minute, second] = /^(\d{4})(\d{2})(\d{2})T(\d{2})(\d{2})(\d{2})Z$/.exec(stamp) ?? [];
  return new Date(Date.UTC(Number(year), Number(month) - 1, Number(day), Number(hour), Number(minute), Number(second)));
}

/** The backups in a folder (names as {@link backupDatabase} writes them), oldest first; other files are ignored. */
export function listBackups(backupsDir: string): BackupEntry[] {
  if (!existsSync(backupsDir)) return [];
  return readdirSync(backupsDir)
    .map((name) => ({ name, match: BACKUP_NAME.exec(name) }))
    .filter((found): found is { name: string; match: RegExpExecArray } => found.match !== null)
    .map(({ name, match }) => ({ file: path.join(backupsDir, name), stamp: match[1], takenAt: stampDate(match[1]), sequence: Number(match[2] ?? 1) }))
    .sort((a, b) => a.stamp.localeCompare(b.stamp) || a.sequence - b.sequence)
    .map(({ file, stamp, takenAt }) => ({ file, stamp, takenAt }));
}
