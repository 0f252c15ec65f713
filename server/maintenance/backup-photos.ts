import { existsSync, readFileSync } from 'node:fs';
import { mkdir, rename, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';
import Database from 'better-sqlite3';
import type { PhotoStorageConfig } from '../storage/create-photo-storage';
import { assertStorageKey } from '../storage/storage-key';
import { PhotoTreeWriter, type LinkFile } from './photo-tree-writer';

/** One photograph file a database refers to. */
export interface ReferencedPhoto {
  /** Storage key, relative to the uploads folder (`<case id>/<uuid>.jpg`). */
  key: string;
  /** SHA-256 (hex) of the file as stored, for full-size photographs; null for thumbnails (the row keeps none). */
  sha256: string | null;
}

/** What a backup did with the photographs. */
export type PhotoBackup =
  | {
      kind: 'captured';
      /** `<backup name>-photos/`, the uploads tree of the files the backed-up database refers to. */
      folder: string;
      files: number;
      bytes: number;
      linked: number;
      copied: number;
      /** Keys the database refers to that were already missing from the uploads folder (listed in {@link MISSING_PHOTOS_LIST}). */
      missing: string[];
    }
  | { kind: 'object-storage' }
  | { kind: 'not-reported' };

/**
 * In a photo folder: the keys the database referred to that were already missing from the uploads
 * folder when the backup was taken. A restore accepts their absence (restoring does not make
 * things worse) and refuses the absence of any other file. Storage keys start with a digit, so the
 * name cannot clash with the tree.
 */
export const MISSING_PHOTOS_LIST = 'missing-photos.txt';

/**
 * The photo folder of a backup file: `tidemark-20261202T053000Z.sqlite` → `tidemark-20261202T053000Z-photos`
 * in the same folder (a name without `.sqlite` gets `-photos` appended whole).
 */
export function photoFolderOf(backupFile: string): string {
  return path.join(path.dirname(backupFile), `${path.basename(backupFile, '.sqlite')}-photos`);
}

/** Every photograph file (full size and thumbnail) of a Tidemark database, in row order; none before the photo table exists. */
export function referencedPhotos(db: Database.Database): ReferencedPhoto[] {
  const hasTable = db.prepare("SELECT 1 FROM sqlite_master WHERE type = 'table' AND name = 'photo'").get() !== undefined;
  if (!hasTable) return [];
  return db
    .prepare<[], { storage_key: string; thumbnail_key: string; sha256: string }>('SELECT storage_key, thumbnail_key, sha256 FROM photo ORDER BY id')
    .all()
    .flatMap((row) => [
      { key: row.storage_key, sha256: row.sha256 },
      { key: row.thumbnail_key, sha256: null },
    ]);
}

/** The keys listed in a photo folder's {@link MISSING_PHOTOS_LIST} (none when there is no list). */
export function readMissingList(folder: string): Set<string> {
  const file = path.join(folder, MISSING_PHOTOS_LIST);
  if (!existsSync(file)) return new Set();
  return new Set(
    readFileSync(file, 'utf8')
      .split('\n')
      .map((line) => line.trim())
      .filter(Boolean),
  );
}

/**
 * Places the photographs a database snapshot refers to into `folder`, written under
 * `<folder>.partial` and renamed when complete, so a folder under its real name is always whole.
 * The snapshot is taken first and the files placed after it: a file is stored before its row is
 * committed (photo.service.ts) and never removed once the row exists, so every file the snapshot
 * refers to is complete and still there; files uploaded since are not referenced and not placed.
 *
 * @param snapshotFile the verified database copy (not the live file)
 * @throws {Error} when a key in the database is not a storage key, or a file cannot be read or written
 */
export async function capturePhotos(snapshotFile: string, uploadsDir: string, folder: string, linkFile?: LinkFile): Promise<PhotoBackup & { kind: 'captured' }> {
  const snapshot = new Database(snapshotFile, { readonly: true, fileMustExist: true });
  let photos: ReferencedPhoto[];
  try {
    photos = referencedPhotos(snapshot);
  } finally {
    snapshot.close();
  }
  const partial = `${folder}.partial`;
  await rm(partial, { recursive: true, force: true });
  await mkdir(partial, { recursive: true, mode: 0o700 });
  try {
    const writer = new PhotoTreeWriter(uploadsDir, partial, linkFile);
    const missing: string[] = [];
    for (const key of new Set(photos.map((photo) => assertStorageKey(photo.key)))) {
      if (!(await writer.add(key))) missing.push(key);
    }
    if (missing.length) await writeFile(path.join(partial, MISSING_PHOTOS_LIST), `${missing.join('\n')}\n`, { mode: 0o600 });
    await rename(partial, folder);
    return { kind: 'captured', folder, files: writer.files, bytes: writer.bytes, linked: writer.linked, copied: writer.copied, missing };
  } catch (error) {
    // Leave no half folder behind; the caller's backup fails as a whole.
    await rm(partial, { recursive: true, force: true });
    throw error;
  }
}

/**
 * The photographs' part of a backup: captured beside the database when they live in the uploads
 * folder; skipped with object storage (the bucket keeps its own versions) or when the caller did
 * not say where they live.
 */
export async function backupPhotos(snapshotFile: string, folder: string, storage: PhotoStorageConfig | null | undefined): Promise<PhotoBackup> {
  if (!storage) return { kind: 'not-reported' };
  if (storage.kind === 's3') return { kind: 'object-storage' };
  return capturePhotos(snapshotFile, storage.dir, folder);
}

/** Megabytes with one decimal, as the backup lines print sizes. */
export function megabytes(bytes: number): string {
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

/**
 * What a backup did with the photographs, in one line (and a warning line when some were
 * already missing), for `npm run backup` and the server's daily log.
 */
export function describePhotoBackup(photos: PhotoBackup): string[] {
  if (photos.kind === 'object-storage') {
    return ['Photographs: not in this backup — they are kept in object storage (S3_BUCKET), whose own versioning keeps their history.'];
  }
  if (photos.kind === 'not-reported') return ['Photographs: not in this backup (the server did not say where they are kept).'];
  const lines = [
    `Photographs: ${photos.files} files (${megabytes(photos.bytes)}) in ${photos.folder}${path.sep} — ${photos.linked} hard-linked, ${photos.copied} copied.`,
  ];
  if (photos.missing.length) {
    lines.push(
      `Warning: ${photos.missing.length} photograph files the database refers to were already missing from the uploads folder (first: ${photos.missing[0]}); they are listed in ${path.join(photos.folder, MISSING_PHOTOS_LIST)}.`,
    );
  }
  return lines;
}
