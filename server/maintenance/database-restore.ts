import { closeSync, existsSync, openSync, readSync, realpathSync, rmSync, statSync } from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';
import { createDataSource } from '../data-source';
import { migrations } from '../migrations';
import type { PhotoStorageConfig } from '../storage/create-photo-storage';
import { backupPhotos, photoFolderOf } from './backup-photos';
import { ALL_PAGES, integrityOf, nextBackupPath, writeVerifiedCopy } from './database-backup';
import { DatabaseInUseError, holdDatabaseExclusively, type ExclusiveDatabaseHold } from './exclusive-database-hold';
import { RestoreRefusedError } from './restore-refused-error';
import { stageBackupPhotos, swapInPhotos, type PhotoRestore, type PhotoSwap, type StagedPhotos } from './restore-photos';

export { RestoreRefusedError, type RestoreRefusal } from './restore-refused-error';

/** What a checked backup holds. */
export interface BackupInspection {
  /** Migrations recorded in the backup, in the order they ran. */
  appliedMigrations: string[];
  /** Migrations of this version the backup has not had yet (run after the restore). */
  pendingMigrations: string[];
}

/** What {@link restoreDatabase} did. */
export interface RestoreResult {
  /** The copy of the database as it was just before the restore; null when there was none. */
  safetyCopy: string | null;
  /** Migrations run on the restored data to bring it to this version. */
  appliedMigrations: string[];
  /** Size of the restored database. */
  bytes: number;
  /** The photographs: put back from the backup's photo folder, or why not. */
  photos: PhotoRestore;
  /** The photo folder of the safety copy (the photographs as they were before); null when none was made. */
  safetyPhotos: string | null;
  /** The replaced uploads folder, kept under another name when there was no database to make a safety copy of; else null. */
  photosSetAside: string | null;
}

/** Where {@link restoreDatabase} reads and writes. */
export interface RestoreOptions {
  /** The backup to restore. */
  source: string;
  /** The live SQLite file (`<dataDir>/tidemark.sqlite`). */
  databaseFile: string;
  /** Where the safety copy goes (`<dataDir>/backups`). */
  backupsDir: string;
  /** Time in the safety copy's name; now by default. */
  at?: Date;
  /**
   * Where photographs live. The uploads folder is replaced by the backup's photo folder (checked
   * first: every file the restored database refers to, byte for byte); with object storage, or
   * when not given, photographs are left as they are.
   */
  photoStorage?: PhotoStorageConfig | null;
}

/** Every SQLite file starts with these 16 bytes (sqlite.org/fileformat.html §1.3.1). */
const SQLITE_HEADER = Buffer.from('SQLite format 3\0', 'latin1');

/** Migration names this version knows, in order (TypeORM records each by its `name`). */
export function knownMigrationNames(): string[] {
  return migrations.map((migration) => new migration().name ?? migration.name);
}

function startsLikeSqlite(file: string): boolean {
  const header = Buffer.alloc(SQLITE_HEADER.length);
  const fd = openSync(file, 'r');
  try {
    return readSync(fd, header, 0, header.length, 0) === header.length && header.equals(SQLITE_HEADER);
  } finally {
    closeSync(fd);
  }
}

function isSqliteError(error: unknown, ...codes: string[]): error is InstanceType<typeof Database.SqliteError> {
  return error instanceof Database.SqliteError && codes.some((code) => error.code.startsWith(code));
}

/**
 * Checks a database file (the staged copy of a backup) is a sound Tidemark database this version
 * can run: `PRAGMA integrity_check` ok, a `migrations` table that starts with Tidemark's first
 * migration, and no migration this version does not know (that would be a newer schema, which an
 * older server must not run on).
 *
 * @throws {RestoreRefusedError} 'damaged', 'not-tidemark' or 'newer-schema'
 */
export function inspectDatabaseFile(file: string): BackupInspection {
  const known = knownMigrationNames();
  let db: Database.Database | undefined;
  try {
    db = new Database(file, { readonly: true, fileMustExist: true });
    const integrity = integrityOf(db);
    if (integrity !== 'ok') throw new RestoreRefusedError('damaged', `The backup is damaged (PRAGMA integrity_check: ${integrity}).`);
    const hasMigrations = db.prepare("SELECT 1 FROM sqlite_master WHERE type = 'table' AND name = 'migrations'").get() !== undefined;
    const applied = hasMigrations ? db.prepare<[], { name: string }>('SELECT name FROM migrations ORDER BY id').all().map((row) => row.name) : [];
    if (applied[0] !== known[0]) throw new RestoreRefusedError('not-tidemark', 'The file is a SQLite database but not a Tidemark database (it has no Tidemark migrations).');
    const unknown = applied.filter((name) => !known.includes(name));
    if (unknown.length) {
      throw new RestoreRefusedError(
        'newer-schema',
        `The backup comes from a newer Tidemark (migrations unknown to this version: ${unknown.join(', ')}). Restore it with that version or a later one.`,
      );
    }
    return { appliedMigrations: applied, pendingMigrations: known.filter((name) => !applied.includes(name)) };
  } catch (error) {
    // A file damaged badly enough fails before integrity_check can report it: same answer.
    if (isSqliteError(error, 'SQLITE_CORRUPT', 'SQLITE_NOTADB')) throw new RestoreRefusedError('damaged', `The backup is damaged (${error.message}).`);
    throw error;
  } finally {
    db?.close();
  }
}

/**
 * Copies the backup into `staged` through the online backup API and leaves it as one rollback-journal
 * file. The backup itself is opened read-only; the -wal/-shm files SQLite may create beside a
 * WAL-mode backup while reading it are removed again if they were not there before.
 */
async function stageBackup(source: string, staged: string): Promise<void> {
  const companions = [`${source}-wal`, `${source}-shm`].filter((file) => !existsSync(file));
  try {
    const reader = new Database(source, { readonly: true, fileMustExist: true });
    try {
      await reader.backup(staged, { progress: () => ALL_PAGES });
    } finally {
      reader.close();
    }
    const copy = new Database(staged, { fileMustExist: true });
    try {
      copy.pragma('journal_mode = DELETE');
    } finally {
      copy.close();
    }
  } catch (error) {
    // Copying or switching the journal of a damaged file fails with SQLite's own code: a refusal, not a crash.
    if (isSqliteError(error, 'SQLITE_CORRUPT', 'SQLITE_NOTADB')) throw new RestoreRefusedError('damaged', `The backup is damaged (${error.message}).`);
    throw error;
  } finally {
    for (const file of companions) rmSync(file, { force: true });
  }
}

/** Runs this version's pending migrations on the staged copy and signs everyone out of it. */
async function migrateStaged(staged: string): Promise<string[]> {
  const dataSource = createDataSource({ database: staged });
  await dataSource.initialize();
  try {
    const applied = await dataSource.runMigrations({ transaction: 'each' });
    // Sessions in a backup belong to the past; a cookie kept since must not come back to life.
    await dataSource.query('DELETE FROM session');
    return applied.map((migration) => migration.name);
  } finally {
    await dataSource.destroy();
  }
}

/** Back to one rollback-journal file, with the live database's page size (a WAL-mode target needs the same). */
function settleStaged(staged: string, pageSize: number | null): void {
  const db = new Database(staged, { fileMustExist: true });
  try {
    db.pragma('journal_mode = DELETE');
    if (pageSize !== null && db.pragma('page_size', { simple: true }) !== pageSize) {
      db.pragma(`page_size = ${pageSize}`);
      db.exec('VACUUM');
    }
  } finally {
    db.close();
  }
}

/**
 * Restores a backup into the live database, all or nothing:
 *
 * 1. refuses while anyone has the live database open (see {@link holdDatabaseExclusively}) and
 *    keeps it to itself from then on, so the server cannot start half-way;
 * 2. copies the backup (online backup API) to a staging file beside the live one and checks it
 *    ({@link inspectDatabaseFile}); with photographs in the uploads folder, checks the backup's
 *    photo folder and stages it as `<uploads>.restoring` (`restore-photos.ts`); a refusal leaves
 *    everything as it was;
 * 3. keeps a safety copy of the live database in `backupsDir` (`before-restore-<stamp>.sqlite`,
 *    with its photo folder: itself a backup that restores);
 * 4. runs the pending migrations on the staged copy and empties its session table;
 * 5. swaps the staged photographs in for the uploads folder (two renames), then writes the staged
 *    copy into the live file through the backup API, which replaces it in one transaction of the
 *    live file's own journal (no stale -wal/-shm, no half-written file); if that write fails, the
 *    old uploads folder is put back.
 *
 * @throws {RestoreRefusedError} when the backup is missing, not SQLite, damaged, not Tidemark's,
 *   from a newer version, the database is in use, or its photo folder lacks or spoils a photograph
 */
export async function restoreDatabase(options: RestoreOptions): Promise<RestoreResult> {
  const { source, databaseFile, backupsDir } = options;
  if (!existsSync(source) || !statSync(source).isFile()) throw new RestoreRefusedError('missing', `There is no backup file at ${source}.`);
  if (existsSync(databaseFile) && realpathSync(source) === realpathSync(databaseFile)) {
    throw new RestoreRefusedError('same-file', 'That is the live database itself; name a backup file.');
  }
  if (!startsLikeSqlite(source)) throw new RestoreRefusedError('not-sqlite', `${source} is not a SQLite database (a Tidemark backup is a .sqlite file made by npm run backup).`);

  let hold: ExclusiveDatabaseHold | null = null;
  let stagedPhotos: StagedPhotos | null = null;
  let swap: PhotoSwap | null = null;
  const staged = path.join(path.dirname(databaseFile), `${path.basename(databaseFile)}.restoring`);
  const stagedFiles = [staged, `${staged}-wal`, `${staged}-shm`, `${staged}-journal`];
  try {
    const hasLiveData = existsSync(databaseFile) && statSync(databaseFile).size > 0;
    if (existsSync(databaseFile)) {
      try {
        hold = holdDatabaseExclusively(databaseFile);
      } catch (error) {
        // In use is an expected answer (the server is running), told as a refusal like the others.
        if (error instanceof DatabaseInUseError) throw new RestoreRefusedError('in-use', error.message);
        throw error;
      }
    }
    for (const file of stagedFiles) rmSync(file, { force: true });
    await stageBackup(source, staged);
    inspectDatabaseFile(staged);
    const photos = await stageBackupPhotos(staged, source, options.photoStorage);
    stagedPhotos = photos.staged;

    const safetyCopy = hold && hasLiveData ? nextBackupPath(backupsDir, options.at ?? new Date(), 'before-restore') : null;
    let safetyPhotos: string | null = null;
    if (hold && safetyCopy) {
      await writeVerifiedCopy(hold.db, safetyCopy, async (checkedCopy) => {
        const captured = await backupPhotos(checkedCopy, photoFolderOf(safetyCopy), options.photoStorage);
        if (captured.kind === 'captured') safetyPhotos = captured.folder;
      });
    }
    const pageSize = hold ? Number(hold.db.pragma('page_size', { simple: true })) : null;

    const appliedMigrations = await migrateStaged(staged);
    settleStaged(staged, pageSize);
    if (inspectDatabaseFile(staged).pendingMigrations.length) throw new Error('The restored database still has pending migrations.');

    if (stagedPhotos) swap = await swapInPhotos(stagedPhotos);
    // The hold must go before the copy: the backup API writes through a connection of its own.
    hold?.release();
    const reader = new Database(staged, { readonly: true, fileMustExist: true });
    try {
      await reader.backup(databaseFile, { progress: () => ALL_PAGES });
    } catch (error) {
      // The live database is as it was: so must the photographs be.
      await swap?.undo();
      swap = null;
      throw error;
    } finally {
      reader.close();
    }
    const live = new Database(databaseFile, { fileMustExist: true, timeout: 5000 });
    try {
      const integrity = integrityOf(live);
      if (integrity !== 'ok') throw new Error(`The restored database failed its integrity check: ${integrity}. The safety copy is ${safetyCopy ?? 'not needed (there was no database)'}.`);
    } finally {
      live.close();
    }
    // The replaced photographs live on in the safety copy's photo folder; without one (no database before), they stay set aside.
    if (safetyPhotos) await swap?.finish();
    const photosSetAside = safetyPhotos ? null : (swap?.aside ?? null);
    return { safetyCopy, appliedMigrations, bytes: statSync(databaseFile).size, photos: photos.report, safetyPhotos, photosSetAside };
  } finally {
    hold?.release();
    for (const file of stagedFiles) rmSync(file, { force: true });
    if (stagedPhotos && !swap) rmSync(stagedPhotos.staging, { recursive: true, force: true });
  }
}
