import { randomBytes } from 'node:crypto';
import { closeSync, existsSync, openSync, readdirSync, rmSync, statSync, writeFileSync, writeSync } from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';
import { createDataSource } from '../../server/data-source';
import { backupDatabase } from '../../server/maintenance/database-backup';
import { knownMigrationNames, restoreDatabase, RestoreRefusedError, type RestoreRefusal } from '../../server/maintenance/database-restore';
import { CLINICAL_TABLES, caseBody, expectStatus } from '../api/support/clinical-fixtures';
import { createTestApp, signedInAs } from '../api/support/test-app';
import { soundness, withDatabase } from './support/database-checks';
import { runTsxScript } from './support/tsx-script';

/*
 * What restore refuses, through the library (fast) and once through the CLI: each refusal must
 * leave the live database, the backups folder and the data dir exactly as they were.
 */

describe('restore refuses what it must not restore', () => {
  let dataDir: string;
  let database: string;
  let backupsDir: string;
  let goodBackup: string;
  let firstCaseId: number;

  /** Row counts of the clinical tables: any restore would change them. */
  const fingerprint = (): Record<string, unknown> =>
    withDatabase(database, (db) => Object.fromEntries(CLINICAL_TABLES.map((table) => [table, db.prepare(`SELECT COUNT(*) AS n FROM ${table}`).get()])));

  /** A copy of the good backup made with the backup API, to be spoiled by the test. */
  const copyOfGood = async (name: string): Promise<string> => {
    const file = path.join(dataDir, name);
    const source = new Database(goodBackup, { readonly: true });
    try {
      await source.backup(file);
    } finally {
      source.close();
    }
    return file;
  };

  const expectRefused = async (source: string, reason: RestoreRefusal, message: RegExp): Promise<void> => {
    const before = fingerprint();
    const backupsBefore = readdirSync(backupsDir);
    const attempt = restoreDatabase({ source, databaseFile: database, backupsDir });
    await expect(attempt).rejects.toBeInstanceOf(RestoreRefusedError);
    await expect(attempt).rejects.toMatchObject({ reason, message: expect.stringMatching(message) });
    expect(fingerprint()).toEqual(before);
    expect(readdirSync(backupsDir)).toEqual(backupsBefore);
    expect(readdirSync(dataDir).filter((name) => name.includes('.restoring'))).toEqual([]);
  };

  beforeAll(async () => {
    const t = await createTestApp();
    const clinician = await signedInAs(t.app, 'clinician');
    const me = (await clinician.get('/api/auth/me')).body.user.id as number;
    firstCaseId = expectStatus(await clinician.post('/api/cases', caseBody(me)), 201).body.id;
    await t.dataSource.destroy();
    dataDir = t.dataDir;
    database = path.join(dataDir, 'tidemark.sqlite');
    backupsDir = path.join(dataDir, 'backups');
    goodBackup = (await backupDatabase({ databaseFile: database, backupsDir })).file;
  });

  afterAll(() => {
    rmSync(dataDir, { recursive: true, force: true });
  });

  it('a file that is not SQLite: random bytes, an empty file (and through the CLI, exit code 1)', async () => {
    const garbage = path.join(dataDir, 'garbage.sqlite');
    writeFileSync(garbage, randomBytes(8192));
    await expectRefused(garbage, 'not-sqlite', /is not a SQLite database/);
    const empty = path.join(dataDir, 'empty.sqlite');
    writeFileSync(empty, '');
    await expectRefused(empty, 'not-sqlite', /is not a SQLite database/);

    const run = await runTsxScript('server/cli/restore.ts', [garbage], { TIDEMARK_DATA_DIR: dataDir });
    expect(run.code).toBe(1);
    expect(run.stderr).toMatch(/Restore refused: .*garbage\.sqlite is not a SQLite database.*Nothing was changed\./);
    const usage = await runTsxScript('server/cli/restore.ts', [], { TIDEMARK_DATA_DIR: dataDir });
    expect(usage.code).toBe(2);
    expect(usage.stderr).toMatch(/Usage: npm run restore -- <backup\.sqlite>/);
  });

  it('a SQLite database that is not Tidemark’s', async () => {
    const other = path.join(dataDir, 'other.sqlite');
    const db = new Database(other);
    db.exec("CREATE TABLE migrations (id INTEGER PRIMARY KEY, timestamp INTEGER, name TEXT); INSERT INTO migrations (timestamp, name) VALUES (1, 'SomethingElse1')");
    db.close();
    await expectRefused(other, 'not-tidemark', /not a Tidemark database/);
  });

  it('a backup from a newer Tidemark (a migration this version does not know)', async () => {
    const newer = await copyOfGood('newer.sqlite');
    const db = new Database(newer);
    db.prepare('INSERT INTO migrations (timestamp, name) VALUES (?, ?)').run(1899999999999, 'FutureFeature1899999999999');
    db.close();
    await expectRefused(newer, 'newer-schema', /newer Tidemark .*FutureFeature1899999999999/);
  });

  it('a damaged backup (PRAGMA integrity_check is not ok)', async () => {
    const damaged = await copyOfGood('damaged.sqlite');
    // Scribble over the middle pages (the b-trees of the clinical tables), leaving page 1 (the
    // header and the schema) intact so that SQLite still opens the file.
    const pageSize = 4096;
    const pages = statSync(damaged).size / pageSize;
    const fd = openSync(damaged, 'r+');
    try {
      for (let page = 2; page < pages - 1; page += 3) writeSync(fd, Buffer.alloc(64, 0xa5), 0, 64, page * pageSize + 8);
    } finally {
      closeSync(fd);
    }
    await expectRefused(damaged, 'damaged', /damaged/);
  });

  it('a missing file, the live database itself, and a database another connection has open', async () => {
    await expectRefused(path.join(dataDir, 'no-such-backup.sqlite'), 'missing', /There is no backup file/);
    await expectRefused(database, 'same-file', /live database itself/);
    const other = new Database(database);
    try {
      other.prepare('SELECT COUNT(*) FROM surgical_case').get();
      await expectRefused(goodBackup, 'in-use', /is in use: stop the Tidemark server/);
    } finally {
      other.close();
    }
  });

  it('an older backup is restored and then migrated to this version', async () => {
    const older = await copyOfGood('older.sqlite');
    // The backup of an older release: the last migration taken back with its own `down`.
    const dataSource = createDataSource({ database: older });
    await dataSource.initialize();
    await dataSource.undoLastMigration({ transaction: 'each' });
    await dataSource.destroy();
    const known = knownMigrationNames();
    expect(withDatabase(older, (db) => db.prepare<[], { name: string }>('SELECT name FROM migrations ORDER BY id').all().map(({ name }) => name))).toEqual(known.slice(0, -1));

    const result = await restoreDatabase({ source: older, databaseFile: database, backupsDir });
    expect(result.appliedMigrations).toEqual(known.slice(-1));
    expect(result.safetyCopy && existsSync(result.safetyCopy)).toBe(true);
    const live = withDatabase(database, (db) => ({
      checks: soundness(db),
      migrations: db.prepare<[], { name: string }>('SELECT name FROM migrations ORDER BY id').all().map(({ name }) => name),
      firstCase: db.prepare('SELECT COUNT(*) AS n FROM surgical_case WHERE id = ?').get(firstCaseId),
    }));
    expect(live).toEqual({ checks: { integrity: 'ok', foreignKeyViolations: [] }, migrations: known, firstCase: { n: 1 } });
  });
});
