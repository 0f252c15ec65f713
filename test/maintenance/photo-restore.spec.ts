import { existsSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { backupTakenSchema, type PhotoView } from '@tidemark/shared';
import { MISSING_PHOTOS_LIST, photoFolderOf } from '../../server/maintenance/backup-photos';
import { backupDatabase } from '../../server/maintenance/database-backup';
import { restoreDatabase, RestoreRefusedError, type RestoreRefusal } from '../../server/maintenance/database-restore';
import { LocalPhotoStorage } from '../../server/storage/photo-storage';
import { createCase, expectStatus } from '../api/support/clinical-fixtures';
import { createTestApp, signedInAs, type ApiClient, type TestApp } from '../api/support/test-app';
import { soundness, withDatabase } from './support/database-checks';
import { clinicalRows, copyBackup, distinctPng, photoKeysOf, photoTree } from './support/photo-files';
import { runTsxScript } from './support/tsx-script';

/*
 * Photographs in backups, through the library and the CLIs on an in-process app's data dir: what
 * restore refuses (and that it then changes nothing), object storage, old database-only backups,
 * a restore onto an empty machine, and the Settings page's "take a backup now". The round trip
 * with the real server running is in photo-backup-restore.spec.ts.
 */

async function uploadPhoto(client: ApiClient, caseId: number, seed: number): Promise<PhotoView> {
  return expectStatus(await client.upload(`/api/cases/${caseId}/photos`, { kind: 'recall' }, { bytes: await distinctPng(seed), filename: 'site.png', contentType: 'image/png' }), 201).body as PhotoView;
}

const S3_ENV = { S3_BUCKET: 'harbourside-photos', S3_REGION: 'eu-west-2' };

describe('photographs in backups and restores', () => {
  let t: TestApp;
  let dataDir: string;
  let database: string;
  let uploadsDir: string;
  let backupsDir: string;
  let good: string;
  let databaseOnly: string;
  const local = () => ({ kind: 'local' as const, dir: uploadsDir });

  /** Everything a restore could change: the records, the uploads tree and the backups folder. */
  const liveState = () => ({
    records: withDatabase(database, clinicalRows),
    uploads: photoTree(uploadsDir),
    backups: readdirSync(backupsDir).sort(),
    staging: readdirSync(dataDir).filter((name) => name.includes('.restoring') || name.includes('.replaced')),
  });

  const expectRefused = async (source: string, reason: RestoreRefusal, message: RegExp): Promise<void> => {
    const before = liveState();
    const attempt = restoreDatabase({ source, databaseFile: database, backupsDir, photoStorage: local() });
    await expect(attempt).rejects.toBeInstanceOf(RestoreRefusedError);
    await expect(attempt).rejects.toMatchObject({ reason, message: expect.stringMatching(message) });
    expect(liveState()).toEqual(before);
  };

  beforeAll(async () => {
    t = await createTestApp();
    dataDir = t.dataDir;
    database = path.join(dataDir, 'tidemark.sqlite');
    uploadsDir = path.join(dataDir, 'uploads');
    backupsDir = path.join(dataDir, 'backups');
    const clinician = await signedInAs(t.app, 'clinician');
    const me = (await clinician.get('/api/auth/me')).body.user.id as number;
    const first = await createCase(clinician, me);
    const second = await createCase(clinician, me);
    await uploadPhoto(clinician, first.id, 1);
    await uploadPhoto(clinician, second.id, 2);
    good = (await backupDatabase({ databaseFile: database, backupsDir, photoStorage: local() })).file;
    // As a release before photographs were backed up wrote them: the database file alone.
    databaseOnly = (await backupDatabase({ databaseFile: database, backupsDir })).file;
    // The live state moves on after the backups.
    await uploadPhoto(clinician, first.id, 3);
    await t.dataSource.destroy();
  });

  afterAll(() => {
    rmSync(dataDir, { recursive: true, force: true });
  });

  it('a backup with its photographs: a photo folder holding exactly the files its database refers to', () => {
    const keys = withDatabase(good, photoKeysOf);
    expect(keys).toHaveLength(4);
    const folder = photoTree(photoFolderOf(good));
    expect(Object.keys(folder)).toEqual(keys);
    // Byte for byte the live files (the live tree also holds the photograph uploaded afterwards).
    const live = photoTree(uploadsDir);
    expect(Object.keys(live)).toHaveLength(6);
    for (const key of keys) expect(folder[key]).toBe(live[key]);
    expect(existsSync(photoFolderOf(databaseOnly))).toBe(false);
  });

  it('refuses a backup whose photo folder lacks a photograph (library and CLI: exit 1, one sentence, nothing changed)', async () => {
    const spoiled = copyBackup(good, dataDir, 'lacking-full-size');
    const [fullSize] = withDatabase(spoiled, (db) => db.prepare<[], { storage_key: string }>('SELECT storage_key FROM photo ORDER BY id').all()).map((row) => row.storage_key);
    rmSync(path.join(photoFolderOf(spoiled), fullSize));
    await expectRefused(spoiled, 'photos-missing', new RegExp(`lacks 1 of the 4 photograph files its database refers to \\(first: ${fullSize}\\)\\.$`));

    const before = liveState();
    const run = await runTsxScript('server/cli/restore.ts', [spoiled], { TIDEMARK_DATA_DIR: dataDir });
    expect(run.code).toBe(1);
    expect(run.stdout).toBe('');
    expect(run.stderr.trim().split('\n')).toEqual([expect.stringMatching(/^Restore refused: The backup's photo folder .*lacking-full-size-photos lacks 1 of the 4 photograph files .* Nothing was changed\.$/)]);
    expect(liveState()).toEqual(before);
  });

  it('refuses a missing thumbnail, and a photograph whose bytes differ from its checksum', async () => {
    const noThumbnail = copyBackup(good, dataDir, 'lacking-thumbnail');
    const thumbnail = withDatabase(noThumbnail, photoKeysOf).find((key) => key.endsWith('-thumb.webp')) ?? '';
    rmSync(path.join(photoFolderOf(noThumbnail), thumbnail));
    await expectRefused(noThumbnail, 'photos-missing', /lacks 1 of the 4 photograph files/);

    const altered = copyBackup(good, dataDir, 'altered');
    const fullSize = withDatabase(altered, photoKeysOf).find((key) => !key.endsWith('-thumb.webp')) ?? '';
    writeFileSync(path.join(photoFolderOf(altered), fullSize), await distinctPng(99));
    await expectRefused(altered, 'photos-damaged', new RegExp(`In the backup's photo folder .*altered-photos, 1 of the 2 photographs differ from the checksums kept in its database \\(first: ${fullSize}\\)`));
  });

  it('refuses a database naming a photograph outside the uploads folder', async () => {
    const foreign = copyBackup(good, dataDir, 'foreign-key');
    withDatabase(foreign, (db) => db.prepare("UPDATE photo SET storage_key = '../secret.key' WHERE id = (SELECT MIN(id) FROM photo)").run());
    await expectRefused(foreign, 'photos-damaged', /names a photograph file "\.\.\/secret\.key" that is not a Tidemark storage key/);
  });

  it('with object storage configured: backups have no photo folder and say so; restores leave the uploads folder alone', async () => {
    const backup = await runTsxScript('server/cli/backup.ts', [], { TIDEMARK_DATA_DIR: dataDir, ...S3_ENV });
    expect(backup.code, backup.stderr).toBe(0);
    const file = /^Backup written: (.+)$/m.exec(backup.stdout)?.[1] ?? '';
    expect(existsSync(file)).toBe(true);
    expect(existsSync(photoFolderOf(file))).toBe(false);
    expect(backup.stdout.split('\n').filter((line) => line.startsWith('Photographs'))).toEqual([
      'Photographs: not in this backup — they are kept in object storage (S3_BUCKET), whose own versioning keeps their history.',
    ]);

    const uploadsBefore = photoTree(uploadsDir);
    const restore = await runTsxScript('server/cli/restore.ts', [good], { TIDEMARK_DATA_DIR: dataDir, ...S3_ENV });
    expect(restore.code, restore.stderr).toBe(0);
    expect(restore.stdout).toMatch(/^Photographs: left as they are — they are kept in object storage \(S3_BUCKET\)/m);
    expect(photoTree(uploadsDir)).toEqual(uploadsBefore);
    expect(withDatabase(database, clinicalRows)).toEqual(withDatabase(good, clinicalRows));
  });

  it('an old database-only backup still restores: the database alone, with a warning line', async () => {
    const uploadsBefore = photoTree(uploadsDir);
    const run = await runTsxScript('server/cli/restore.ts', [databaseOnly], { TIDEMARK_DATA_DIR: dataDir });
    expect(run.code, run.stderr).toBe(0);
    const warnings = run.stdout.split('\n').filter((line) => line.startsWith('Warning'));
    // The uploads folder still holds all four files the old backup's database refers to.
    expect(warnings).toEqual([expect.stringMatching(/^Warning: this backup has no photo folder .* so only the database was restored and .*uploads was left as it is; 0 of the 4 photograph files/)]);
    expect(photoTree(uploadsDir)).toEqual(uploadsBefore);
    expect(withDatabase(database, (db) => ({ checks: soundness(db), records: clinicalRows(db) }))).toEqual({
      checks: { integrity: 'ok', foreignKeyViolations: [] },
      records: withDatabase(databaseOnly, clinicalRows),
    });
  });

  it('a photograph already missing when the backup was taken is listed, and does not stop the restore', async () => {
    const [lostKey] = withDatabase(database, photoKeysOf);
    rmSync(path.join(uploadsDir, lostKey));
    const backup = await backupDatabase({ databaseFile: database, backupsDir, photoStorage: local() });
    expect(backup.photos).toMatchObject({ kind: 'captured', files: 3, missing: [lostKey] });
    expect(photoTree(photoFolderOf(backup.file))).toHaveProperty([MISSING_PHOTOS_LIST]);

    const result = await restoreDatabase({ source: backup.file, databaseFile: database, backupsDir, photoStorage: local() });
    expect(result.photos).toMatchObject({ kind: 'restored', files: 3, knownMissing: [lostKey] });
    // Exactly the backup's files, the list of missing ones aside.
    const { [MISSING_PHOTOS_LIST]: list, ...backedUp } = photoTree(photoFolderOf(backup.file));
    expect(list).toBeDefined();
    expect(photoTree(uploadsDir)).toEqual(backedUp);
  });

  it('restores database and photographs onto an empty machine (after a disk loss)', async () => {
    const machine = mkdtempSync(path.join(tmpdir(), 'tidemark-new-machine-'));
    try {
      const result = await restoreDatabase({
        source: good,
        databaseFile: path.join(machine, 'tidemark.sqlite'),
        backupsDir: path.join(machine, 'backups'),
        photoStorage: { kind: 'local', dir: path.join(machine, 'uploads') },
      });
      expect(result).toMatchObject({ safetyCopy: null, safetyPhotos: null, photosSetAside: null, photos: { kind: 'restored', files: 4 } });
      expect(photoTree(path.join(machine, 'uploads'))).toEqual(photoTree(photoFolderOf(good)));
      expect(withDatabase(path.join(machine, 'tidemark.sqlite'), clinicalRows)).toEqual(withDatabase(good, clinicalRows));
      expect(readdirSync(machine).sort()).toEqual(['tidemark.sqlite', 'uploads']);

      // Photographs left on a machine without a database are never deleted: they are set aside.
      rmSync(path.join(machine, 'tidemark.sqlite'));
      writeFileSync(path.join(machine, 'uploads', 'stray.jpg'), 'a file nobody refers to');
      const again = await restoreDatabase({
        source: good,
        databaseFile: path.join(machine, 'tidemark.sqlite'),
        backupsDir: path.join(machine, 'backups'),
        photoStorage: { kind: 'local', dir: path.join(machine, 'uploads') },
      });
      expect(again.photosSetAside).toMatch(/uploads\.replaced-\d+$/);
      expect(Object.keys(photoTree(again.photosSetAside ?? ''))).toContain('stray.jpg');
      expect(photoTree(path.join(machine, 'uploads'))).toEqual(photoTree(photoFolderOf(good)));
    } finally {
      rmSync(machine, { recursive: true, force: true });
    }
  });
});

describe('the Settings page’s "take a backup now" with photographs in the uploads folder', () => {
  let t: TestApp;
  let uploadsDir: string;

  beforeAll(async () => {
    uploadsDir = mkdtempSync(path.join(tmpdir(), 'tidemark-settings-uploads-'));
    t = await createTestApp({ photoStorage: new LocalPhotoStorage(uploadsDir), installation: { photoStorage: { kind: 'local', dir: uploadsDir } } });
  });
  afterAll(async () => {
    await t.close();
    rmSync(uploadsDir, { recursive: true, force: true });
  });

  it('captures the photographs its database refers to beside the database file', async () => {
    const clinician = await signedInAs(t.app, 'clinician');
    const me = (await clinician.get('/api/auth/me')).body.user.id as number;
    const found = await createCase(clinician, me);
    await uploadPhoto(clinician, found.id, 4);
    await uploadPhoto(clinician, found.id, 5);

    const admin = await signedInAs(t.app, 'admin');
    const response = await admin.post('/api/settings/backups');
    expect(response.status, JSON.stringify(response.body)).toBe(201);
    const file = path.join(t.dataDir, 'backups', backupTakenSchema.parse(response.body).name);
    const keys = withDatabase(file, photoKeysOf);
    expect(keys).toHaveLength(4);
    expect(photoTree(photoFolderOf(file))).toEqual(photoTree(uploadsDir));
    // The backups list still shows database files only.
    const { body } = await admin.get('/api/settings/system');
    expect(body.backups.files.map((listed: { name: string }) => listed.name)).toEqual([path.basename(file)]);
  });
});
