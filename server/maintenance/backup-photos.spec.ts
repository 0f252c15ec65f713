import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { backupPhotos, capturePhotos, describePhotoBackup, MISSING_PHOTOS_LIST, photoFolderOf, referencedPhotos } from './backup-photos';
import { backupDatabase } from './database-backup';

/** A full-size key and its thumbnail's, in the server's shape (storage-key.ts). */
function photoKeys(caseId: number): { storageKey: string; thumbnailKey: string } {
  const base = `${caseId}/${randomUUID()}`;
  return { storageKey: `${base}.jpg`, thumbnailKey: `${base}-thumb.webp` };
}

/** Files of a tree, relative, sorted. */
function treeFiles(folder: string): string[] {
  return readdirSync(folder, { recursive: true, withFileTypes: true })
    .filter((entry) => entry.isFile())
    .map((entry) => path.relative(folder, path.join(entry.parentPath, entry.name)))
    .sort();
}

describe('photographs in a backup', () => {
  let folder: string;
  let uploadsDir: string;
  let databaseFile: string;
  let db: Database.Database;

  /** Stores a file under the uploads folder and its row in the database (as photo.service.ts does: file first). */
  const storePhoto = (caseId: number, { withFiles = true } = {}) => {
    const keys = photoKeys(caseId);
    const bytes = randomBytes(2048);
    if (withFiles) {
      mkdirSync(path.join(uploadsDir, String(caseId)), { recursive: true });
      writeFileSync(path.join(uploadsDir, keys.storageKey), bytes);
      writeFileSync(path.join(uploadsDir, keys.thumbnailKey), bytes.subarray(0, 100));
    }
    db.prepare('INSERT INTO photo (storage_key, thumbnail_key, sha256) VALUES (?, ?, ?)').run(keys.storageKey, keys.thumbnailKey, createHash('sha256').update(bytes).digest('hex'));
    return keys;
  };

  beforeEach(() => {
    folder = mkdtempSync(path.join(tmpdir(), 'tidemark-backup-photos-'));
    uploadsDir = path.join(folder, 'uploads');
    databaseFile = path.join(folder, 'tidemark.sqlite');
    db = new Database(databaseFile);
    db.pragma('journal_mode = WAL');
    // The columns of the photo table that backups read (migration 1764700000000-clinical-records).
    db.exec('CREATE TABLE photo (id INTEGER PRIMARY KEY, storage_key VARCHAR(200) NOT NULL, thumbnail_key VARCHAR(200) NOT NULL, sha256 VARCHAR(64) NOT NULL)');
  });
  afterEach(() => {
    db.close();
    rmSync(folder, { recursive: true, force: true });
  });

  it('names the photo folder after the backup file, beside it', () => {
    expect(photoFolderOf('/data/backups/tidemark-20261202T053000Z.sqlite')).toBe('/data/backups/tidemark-20261202T053000Z-photos');
    expect(photoFolderOf('/data/backups/daily/tidemark-20261202T053000Z-2.sqlite')).toBe('/data/backups/daily/tidemark-20261202T053000Z-2-photos');
    expect(photoFolderOf('/elsewhere/copy.db')).toBe('/elsewhere/copy.db-photos');
  });

  it('reads both files of every photo row, and none from a database without the photo table', () => {
    const first = storePhoto(3);
    expect(referencedPhotos(db)).toEqual([
      { key: first.storageKey, sha256: expect.stringMatching(/^[0-9a-f]{64}$/) },
      { key: first.thumbnailKey, sha256: null },
    ]);
    const bare = new Database(':memory:');
    expect(referencedPhotos(bare)).toEqual([]);
    bare.close();
  });

  it('backs up exactly the files the database refers to, as hard links, and lists those already missing', async () => {
    const kept = storePhoto(4);
    const lost = storePhoto(4, { withFiles: false });
    // On disk without a row: an upload whose row was not committed when the snapshot was taken.
    const unreferenced = photoKeys(5);
    mkdirSync(path.join(uploadsDir, '5'), { recursive: true });
    writeFileSync(path.join(uploadsDir, unreferenced.storageKey), 'in flight');

    const backup = await backupDatabase({ databaseFile, backupsDir: path.join(folder, 'backups'), at: new Date('2026-12-02T05:30:00Z'), photoStorage: { kind: 'local', dir: uploadsDir } });
    const photoFolder = path.join(folder, 'backups', 'tidemark-20261202T053000Z-photos');
    expect(backup.photos).toEqual({ kind: 'captured', folder: photoFolder, files: 2, bytes: 2048 + 100, linked: 2, copied: 0, missing: [lost.storageKey, lost.thumbnailKey] });
    expect(treeFiles(photoFolder)).toEqual([kept.storageKey, kept.thumbnailKey, MISSING_PHOTOS_LIST].sort());
    expect(readFileSync(path.join(photoFolder, MISSING_PHOTOS_LIST), 'utf8')).toBe(`${lost.storageKey}\n${lost.thumbnailKey}\n`);
    // A hard link: the same inode as the live file (link(2)), so no second copy of the bytes.
    expect(statSync(path.join(photoFolder, kept.storageKey)).ino).toBe(statSync(path.join(uploadsDir, kept.storageKey)).ino);
    expect(describePhotoBackup(backup.photos)).toEqual([
      `Photographs: 2 files (0.0 MB) in ${photoFolder}${path.sep} — 2 hard-linked, 0 copied.`,
      expect.stringMatching(/^Warning: 2 photograph files the database refers to were already missing from the uploads folder \(first: 4\/.*\.jpg\); they are listed in .*missing-photos\.txt\.$/),
    ]);

    // Removing the live file (as photo.service.ts does only for a row that was never written) drops one name: the backup keeps the bytes.
    const bytes = readFileSync(path.join(uploadsDir, kept.storageKey));
    rmSync(path.join(uploadsDir, kept.storageKey));
    expect(readFileSync(path.join(photoFolder, kept.storageKey))).toEqual(bytes);
  });

  it('copies when the filesystem refuses hard links (another device), byte for byte, and stops trying to link', async () => {
    const first = storePhoto(7);
    const second = storePhoto(8);
    let linkAttempts = 0;
    const crossDevice = async (): Promise<void> => {
      linkAttempts += 1;
      // What link(2) answers across filesystems.
      throw Object.assign(new Error('EXDEV: cross-device link not permitted'), { code: 'EXDEV' });
    };
    const photoFolder = path.join(folder, 'copy-photos');
    const captured = await capturePhotos(databaseFile, uploadsDir, photoFolder, crossDevice);
    expect(captured).toMatchObject({ files: 4, linked: 0, copied: 4, missing: [] });
    expect(linkAttempts).toBe(1);
    for (const key of [first.storageKey, first.thumbnailKey, second.storageKey, second.thumbnailKey]) {
      expect(readFileSync(path.join(photoFolder, key))).toEqual(readFileSync(path.join(uploadsDir, key)));
      expect(statSync(path.join(photoFolder, key)).ino).not.toBe(statSync(path.join(uploadsDir, key)).ino);
    }
  });

  it('fails whole on any other error, leaving neither the folder nor a partial one', async () => {
    storePhoto(9);
    const denied = async (): Promise<void> => {
      throw Object.assign(new Error('EACCES: permission denied'), { code: 'EACCES' });
    };
    const photoFolder = path.join(folder, 'denied-photos');
    await expect(capturePhotos(databaseFile, uploadsDir, photoFolder, denied)).rejects.toThrow(/EACCES/);
    expect(existsSync(photoFolder) || existsSync(`${photoFolder}.partial`)).toBe(false);
  });

  it('refuses a key that is not a storage key instead of reading outside the uploads folder', async () => {
    db.prepare('INSERT INTO photo (storage_key, thumbnail_key, sha256) VALUES (?, ?, ?)').run('../secret.key', '1/x-thumb.webp', 'x');
    const backupsDir = path.join(folder, 'backups');
    await expect(backupDatabase({ databaseFile, backupsDir, photoStorage: { kind: 'local', dir: uploadsDir } })).rejects.toThrow(/Refusing storage key "\.\.\/secret\.key"/);
    // The failed backup leaves nothing under a real name.
    expect(readdirSync(backupsDir)).toEqual([]);
  });

  it('skips photographs kept in object storage, and says so in one line', async () => {
    storePhoto(10);
    const backupsDir = path.join(folder, 'backups');
    const backup = await backupDatabase({
      databaseFile,
      backupsDir,
      photoStorage: { kind: 's3', bucket: 'practice-photos', prefix: '', region: 'eu-west-2', endpoint: null, forcePathStyle: false },
    });
    expect(backup.photos).toEqual({ kind: 'object-storage' });
    expect(readdirSync(backupsDir)).toEqual([path.basename(backup.file)]);
    expect(describePhotoBackup(backup.photos)).toEqual([expect.stringMatching(/^Photographs: not in this backup — they are kept in object storage \(S3_BUCKET\), whose own versioning/)]);
    expect(await backupPhotos(databaseFile, path.join(folder, 'unused'), undefined)).toEqual({ kind: 'not-reported' });
  });
});
