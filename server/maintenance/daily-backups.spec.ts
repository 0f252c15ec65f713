import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { takeDailyBackupIfDue } from './daily-backups';

describe('daily backups', () => {
  let folder: string;
  let databaseFile: string;
  beforeAll(() => {
    folder = mkdtempSync(path.join(tmpdir(), 'tidemark-daily-unit-'));
    databaseFile = path.join(folder, 'tidemark.sqlite');
    const db = new Database(databaseFile);
    db.exec('CREATE TABLE t (x)');
    db.close();
  });
  afterAll(() => {
    rmSync(folder, { recursive: true, force: true });
  });

  it('backs up once a day whatever the number of checks, and keeps the newest N', async () => {
    const backupsDir = path.join(folder, 'backups');
    const at = (iso: string) => ({ databaseFile, backupsDir, keep: 2, now: () => new Date(iso) });
    expect(await takeDailyBackupIfDue(at('2026-12-01T02:00:00Z'))).not.toBeNull();
    // Hourly checks within the day take nothing.
    expect(await takeDailyBackupIfDue(at('2026-12-01T03:00:00Z'))).toBeNull();
    expect(await takeDailyBackupIfDue(at('2026-12-02T01:59:59Z'))).toBeNull();
    expect(await takeDailyBackupIfDue(at('2026-12-02T02:00:00Z'))).not.toBeNull();
    expect(await takeDailyBackupIfDue(at('2026-12-03T02:30:00Z'))).not.toBeNull();
    expect(readdirSync(path.join(backupsDir, 'daily')).sort()).toEqual(['tidemark-20261202T020000Z.sqlite', 'tidemark-20261203T023000Z.sqlite']);
    // Daily backups stay in daily/: manual ones in backups/ are never pruned by them.
    expect(readdirSync(backupsDir)).toEqual(['daily']);
  });
});
