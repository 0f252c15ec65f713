import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { backupDatabase, backupStamp, listBackups, nextBackupPath } from './database-backup';

describe('backup names and the backup itself', () => {
  let folder: string;
  beforeEach(() => {
    folder = mkdtempSync(path.join(tmpdir(), 'tidemark-backup-unit-'));
  });
  afterEach(() => {
    rmSync(folder, { recursive: true, force: true });
  });

  it('stamps in ISO 8601 basic format, UTC, to the second', () => {
    // ISO 8601-1:2019 basic format: YYYYMMDDThhmmssZ.
    expect(backupStamp(new Date('2026-12-02T05:30:00.999Z'))).toBe('20261202T053000Z');
    expect(backupStamp(new Date('2027-01-09T23:04:05+01:00'))).toBe('20270109T220405Z');
  });

  it('never reuses a name: a second backup in the same second gets -2, then -3', () => {
    const at = new Date('2026-12-02T05:30:00Z');
    const first = nextBackupPath(folder, at);
    expect(path.basename(first)).toBe('tidemark-20261202T053000Z.sqlite');
    writeFileSync(first, '');
    expect(path.basename(nextBackupPath(folder, at))).toBe('tidemark-20261202T053000Z-2.sqlite');
    writeFileSync(path.join(folder, 'tidemark-20261202T053000Z-2.sqlite.partial'), '');
    expect(path.basename(nextBackupPath(folder, at))).toBe('tidemark-20261202T053000Z-3.sqlite');
    // A photo folder left without its database (a crash between the two) keeps its name taken too.
    mkdirSync(path.join(folder, 'tidemark-20261202T053000Z-3-photos'));
    expect(path.basename(nextBackupPath(folder, at))).toBe('tidemark-20261202T053000Z-4.sqlite');
  });

  it('lists backups oldest first, same-second ones in order, other files ignored', () => {
    for (const name of ['tidemark-20261202T053000Z-2.sqlite', 'tidemark-20261201T230000Z.sqlite', 'tidemark-20261202T053000Z.sqlite', 'before-restore-20261101T000000Z.sqlite', 'notes.txt']) {
      writeFileSync(path.join(folder, name), '');
    }
    mkdirSync(path.join(folder, 'tidemark-20261202T053000Z-photos'));
    expect(listBackups(folder).map((entry) => path.basename(entry.file))).toEqual(['tidemark-20261201T230000Z.sqlite', 'tidemark-20261202T053000Z.sqlite', 'tidemark-20261202T053000Z-2.sqlite']);
    expect(listBackups(folder)[0].takenAt.toISOString()).toBe('2026-12-01T23:00:00.000Z');
    expect(listBackups(path.join(folder, 'missing'))).toEqual([]);
  });

  it('copies a WAL database with uncheckpointed commits into one verified file', async () => {
    const live = path.join(folder, 'live.sqlite');
    const db = new Database(live);
    db.pragma('journal_mode = WAL');
    // Keep the commits in the -wal file: a file copy of live.sqlite alone would miss them.
    db.pragma('wal_autocheckpoint = 0');
    db.exec('CREATE TABLE reading (mm REAL)');
    const insert = db.prepare('INSERT INTO reading VALUES (?)');
    db.transaction(() => {
      for (let index = 0; index < 1000; index += 1) insert.run(index / 2);
    })();
    try {
      const backup = await backupDatabase({ databaseFile: live, backupsDir: path.join(folder, 'backups'), at: new Date('2026-12-02T05:30:00Z') });
      expect(path.basename(backup.file)).toBe('tidemark-20261202T053000Z.sqlite');
      const copy = new Database(backup.file, { readonly: true });
      try {
        // Σ i/2 for i = 0…999 = 999·1000/4 = 249,750 (arithmetic series).
        expect(copy.prepare('SELECT COUNT(*) AS n, SUM(mm) AS total FROM reading').get()).toEqual({ n: 1000, total: 249750 });
        expect(copy.pragma('journal_mode', { simple: true })).toBe('delete');
      } finally {
        copy.close();
      }
    } finally {
      db.close();
    }
  });

  it('refuses when there is no database', async () => {
    await expect(backupDatabase({ databaseFile: path.join(folder, 'none.sqlite'), backupsDir: folder })).rejects.toThrow(/There is no database/);
  });
});
