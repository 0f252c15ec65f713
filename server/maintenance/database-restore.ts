import { closeSync, existsSync, openSync, readSync, realpathSync, rmSync, statSync } from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';
import { createDataSource } from '../data-source';
import { migrations } from '../migrations';
import { ALL_PAGES, integrityOf, nextBackupPath, writeVerifiedCopy } from './database-backup';
import { DatabaseInUseError, holdDatabaseExclusively, type ExclusiveDatabaseHold } from './exclusive-database-hold';

/** Why a restore was refused (nothing was changed). */
export type RestoreRefusal = 'missing' | 'same-file' | 'not-sqlite' | 'damaged' | 'not-tidemark' | 'newer-schema' | 'in-use';

/** A restore refused before the live database was touched; the message is for people. */
export class RestoreRefusedError extends Error {
  constructor(
    readonly reason: RestoreRefusal,
    message: string,
  ) {
    super(message);
    this.name = 'RestoreRefusedError';
  }
}

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
 *    ({@link inspectDatabaseFile}); a refusal leaves everything as it was;
 * 3. keeps a safety copy of the live database in `backupsDir` (`before-restore-<stamp>.sqlite`);
 * 4. runs the pending migrations on the staged copy and empties its session table;
 * 5. writes the staged copy into the live file through the backup API, which replaces it in one
 *    transaction of the live file's own journal (no stale -wal/-shm, no half-written file).
 *
 * @throws {RestoreRefusedError} when the backup is missing, not SQLite, damaged, not Tidemark's,
 *   from a newer version, or the database is in use
 */
export async function restoreDatabase(options: RestoreOptions): Promise<RestoreResult> {
  const { source, databaseFile, backupsDir } = options;
  if (!existsSync(source) || !statSync(source).isFile()) throw new RestoreRefusedError('missing', `There is no backup file at ${source}.`);
  if (existsSync(databaseFile) && realpathSync(source) === realpathSync(databaseFile)) {
    throw new RestoreRefusedError('same-file', 'That is the live database itself; name a backup file.');
  }
  if (!startsLikeSqlite(source)) throw new RestoreRefusedError('not-sqlite', `${source} is not a SQLite database (a Tidemark backup is a .sqlite file made by npm run backup).`);

  let hold: ExclusiveDatabaseHold | null = null;
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

    const safetyCopy = hold && hasLiveData ? nextBackupPath(backupsDir, options.at ?? new Date(), 'before-restore') : null;
    if (hold && safetyCopy) await writeVerifiedCopy(hold.db, safetyCopy);
    const pageSize = hold ? Number(hold.db.pragma('page_size', { simple: true })) : null;

    const appliedMigrations = await migrateStaged(staged);
    settleStaged(staged, pageSize);
    if (inspectDatabaseFile(staged).pendingMigrations.length) throw new Error('The restored database still has pending migrations.');

    // The hold must go before the copy: the backup API writes through a connection of its own.
    hold?.release();
    const reader = new Database(staged, { readonly: true, fileMustExist: true });
    try {
      await reader.backup(databaseFile, { progress: () => ALL_PAGES });
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
    return { safetyCopy, appliedMigrations, bytes: statSync(databaseFile).size };
  } finally {
    hold?.release();
    for (const file of stagedFiles) rmSync(file, { force: true });
  }
}
