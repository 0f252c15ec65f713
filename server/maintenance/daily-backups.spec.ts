import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { pruneBackups, startDailyBackups, takeDailyBackupIfDue } from './daily-backups';

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

  it('captures the photographs with each daily backup and prunes the photo folder with its database', async () => {
    const backupsDir = path.join(folder, 'backups-with-photos');
    const uploadsDir = path.join(folder, 'uploads');
    const key = '3/0b5e8f3c-2d4a-4f8e-9a71-5c3e2b1d0f44.jpg';
    const thumbnail = '3/0b5e8f3c-2d4a-4f8e-9a71-5c3e2b1d0f44-thumb.webp';
    mkdirSync(path.join(uploadsDir, '3'), { recursive: true });
    writeFileSync(path.join(uploadsDir, key), 'full-size bytes');
    writeFileSync(path.join(uploadsDir, thumbnail), 'thumbnail bytes');
    const photoDb = path.join(folder, 'with-photos.sqlite');
    const db = new Database(photoDb);
    db.exec('CREATE TABLE photo (id INTEGER PRIMARY KEY, storage_key TEXT, thumbnail_key TEXT, sha256 TEXT)');
    db.prepare('INSERT INTO photo (storage_key, thumbnail_key, sha256) VALUES (?, ?, ?)').run(key, thumbnail, 'not checked by backups');
    db.close();
    const at = (iso: string) => ({ databaseFile: photoDb, backupsDir, keep: 2, now: () => new Date(iso), photoStorage: { kind: 'local' as const, dir: uploadsDir } });
    for (const day of ['2026-12-01', '2026-12-02', '2026-12-03']) expect((await takeDailyBackupIfDue(at(`${day}T02:00:00Z`)))?.photos.kind).toBe('captured');
    const daily = path.join(backupsDir, 'daily');
    // The oldest backup went with its photo folder; the newest two keep theirs, each whole.
    expect(readdirSync(daily).sort()).toEqual([
      'tidemark-20261202T020000Z-photos',
      'tidemark-20261202T020000Z.sqlite',
      'tidemark-20261203T020000Z-photos',
      'tidemark-20261203T020000Z.sqlite',
    ]);
    for (const kept of ['tidemark-20261202T020000Z-photos', 'tidemark-20261203T020000Z-photos']) {
      expect(readFileSync(path.join(daily, kept, key), 'utf8')).toBe('full-size bytes');
      expect(readFileSync(path.join(daily, kept, thumbnail), 'utf8')).toBe('thumbnail bytes');
    }
    // pruneBackups leaves files that are not backups alone.
    writeFileSync(path.join(daily, 'notes.txt'), 'kept');
    expect(pruneBackups(daily, 1).map((file) => path.basename(file))).toEqual(['tidemark-20261202T020000Z.sqlite']);
    expect(readdirSync(daily).sort()).toEqual(['notes.txt', 'tidemark-20261203T020000Z-photos', 'tidemark-20261203T020000Z.sqlite']);
  });

  it('logs the photographs line of the daily backup', async () => {
    const lines: string[] = [];
    const stop = startDailyBackups({
      databaseFile,
      backupsDir: path.join(folder, 'logged'),
      keep: 1,
      firstCheckAfterMs: 0,
      photoStorage: { kind: 's3', bucket: 'practice-photos', prefix: '', region: 'eu-west-2', endpoint: null, forcePathStyle: false },
      log: (line) => lines.push(line),
    });
    try {
      await vi.waitFor(() => expect(lines).toHaveLength(1));
    } finally {
      stop();
    }
    expect(lines[0]).toMatch(/^Daily backup written: .*tidemark-\d{8}T\d{6}Z\.sqlite \(\d+ bytes, integrity ok\)\. Photographs: not in this backup — they are kept in object storage/);
  });
});
