import Database from 'better-sqlite3';

/** Another connection has the database open: the server is running, or another program uses the file. */
export class DatabaseInUseError extends Error {
  constructor(readonly databaseFile: string) {
    super(
      `The database ${databaseFile} is in use: stop the Tidemark server (and any other program that has the file open, such as a running backup) and try again.`,
    );
    this.name = 'DatabaseInUseError';
  }
}

/** An open connection that alone holds the database; nobody else can read or write until released. */
export interface ExclusiveDatabaseHold {
  /** The holding connection (e.g. the source of a safety copy). */
  readonly db: Database.Database;
  /** Closes the connection, which lets others in again. Safe to call twice. */
  release(): void;
}

/**
 * Takes the database for this process alone, or fails at once if anyone else has it open.
 *
 * Why this detects a running server without a pid file: the server keeps one connection open for
 * its whole life, and in WAL mode every open connection holds a SHARED lock on the database file
 * until it closes (sqlite.org/wal.html, sqlite.org/lockingv3.html). A connection in
 * `locking_mode=EXCLUSIVE` needs an EXCLUSIVE lock on that file to open the WAL, so it is refused
 * while any other connection — in this or another process — is open. The locks belong to the
 * processes: a server killed with SIGKILL leaves no stale lock behind, unlike a pid file. While
 * the hold lasts, a server that tries to start waits for its busy timeout and then fails, so it
 * cannot start in the middle of a restore.
 *
 * @param timeoutMs how long to wait for a connection that is just closing
 * @throws {DatabaseInUseError} when another connection has the database open
 */
export function holdDatabaseExclusively(databaseFile: string, timeoutMs = 250): ExclusiveDatabaseHold {
  const db = new Database(databaseFile, { fileMustExist: true, timeout: timeoutMs });
  try {
    db.pragma('locking_mode = EXCLUSIVE');
    // A write transaction takes the EXCLUSIVE lock; in exclusive locking mode it is kept after COMMIT.
    db.exec('BEGIN EXCLUSIVE; COMMIT;');
  } catch (error) {
    // BUSY is the answer we probe for (someone else has the file open); anything else is a real failure.
    db.close();
    if (error instanceof Database.SqliteError && error.code.startsWith('SQLITE_BUSY')) throw new DatabaseInUseError(databaseFile);
    throw error;
  }
  return {
    db,
    release: () => {
      if (db.open) db.close();
    },
  };
}
