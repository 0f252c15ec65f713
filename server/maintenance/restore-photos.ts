import { createHash } from 'node:crypto';
import { existsSync, realpathSync, statSync } from 'node:fs';
import { mkdir, readFile, rename, rm, stat } from 'node:fs/promises';
import path from 'node:path';
import Database from 'better-sqlite3';
import type { PhotoStorageConfig } from '../storage/create-photo-storage';
import { STORAGE_KEY_PATTERN } from '../storage/storage-key';
import { photoFolderOf, readMissingList, referencedPhotos, type ReferencedPhoto } from './backup-photos';
import { PhotoTreeWriter } from './photo-tree-writer';
import { RestoreRefusedError } from './restore-refused-error';

/** What a restore did with the photographs. */
export type PhotoRestore =
  | {
      kind: 'restored';
      /** The backup's photo folder the files came from. */
      folder: string;
      /** The uploads folder, now holding exactly the files the restored database refers to. */
      uploadsDir: string;
      files: number;
      bytes: number;
      linked: number;
      copied: number;
      /** Files already missing when the backup was taken (its `missing-photos.txt`), so missing now too. */
      knownMissing: string[];
    }
  | {
      kind: 'no-photo-folder';
      /** Where the backup's photo folder would be. */
      folder: string;
      uploadsDir: string;
      /** Files the restored database refers to, and how many of them the uploads folder lacks. */
      referenced: number;
      absentFromUploads: number;
    }
  | { kind: 'object-storage' }
  | { kind: 'not-reported' };

/** Checked and staged before anything live changes; swapped in by {@link swapInPhotos}. */
export interface StagedPhotos {
  report: PhotoRestore & { kind: 'restored' };
  /** `<uploads>.restoring`, beside the (real) uploads folder. */
  staging: string;
}

function sha256Of(bytes: Buffer): string {
  return createHash('sha256').update(bytes).digest('hex');
}

/** The uploads folder as it really is on disk (a symbolic link followed), even before it exists. */
function realUploadsDir(uploadsDir: string): string {
  return existsSync(uploadsDir) ? realpathSync(uploadsDir) : path.resolve(uploadsDir);
}

/**
 * Checks that a backup's photo folder holds every photograph its database refers to, byte for
 * byte (the SHA-256 each photo row keeps), and stages them as `<uploads>.restoring` (hard links
 * where possible). Nothing live is touched; the caller removes the staging folder if it stops.
 *
 * @param stagedDatabase the staged copy of the backup's database
 * @param backupFile the backup as named by the person (its photo folder sits beside it)
 * @returns null when photographs are not restored (see `report`), else the staged tree
 * @throws {RestoreRefusedError} 'photos-missing', 'photos-damaged' or 'uploads-mount'
 */
export async function stageBackupPhotos(
  stagedDatabase: string,
  backupFile: string,
  storage: PhotoStorageConfig | null | undefined,
): Promise<{ staged: StagedPhotos | null; report: PhotoRestore }> {
  if (!storage) return { staged: null, report: { kind: 'not-reported' } };
  if (storage.kind === 's3') return { staged: null, report: { kind: 'object-storage' } };
  const db = new Database(stagedDatabase, { readonly: true, fileMustExist: true });
  let photos: ReferencedPhoto[];
  try {
    photos = referencedPhotos(db);
  } finally {
    db.close();
  }
  const uploadsDir = realUploadsDir(storage.dir);
  const folder = photoFolderOf(backupFile);
  if (!existsSync(folder)) {
    // A backup from before photographs were included: the database alone, uploads left as they are.
    let absentFromUploads = 0;
    for (const { key } of photos) if (!STORAGE_KEY_PATTERN.test(key) || !existsSync(path.join(uploadsDir, key))) absentFromUploads += 1;
    return { staged: null, report: { kind: 'no-photo-folder', folder, uploadsDir, referenced: photos.length, absentFromUploads } };
  }
  const foreign = photos.find((photo) => !STORAGE_KEY_PATTERN.test(photo.key));
  if (foreign) throw new RestoreRefusedError('photos-damaged', `The backup's database names a photograph file "${foreign.key}" that is not a Tidemark storage key, so it is not restored.`);
  if (existsSync(uploadsDir) && statSync(uploadsDir).dev !== statSync(path.dirname(uploadsDir)).dev) {
    throw new RestoreRefusedError(
      'uploads-mount',
      `The uploads folder ${uploadsDir} is a mount point and cannot be swapped in one step; mount its parent folder instead, or restore with the photographs copied in by hand from ${folder}.`,
    );
  }
  const knownMissing = readMissingList(folder);
  const absent: string[] = [];
  const damaged: string[] = [];
  for (const photo of photos) {
    const file = path.join(folder, photo.key);
    if (!existsSync(file)) {
      if (!knownMissing.has(photo.key)) absent.push(photo.key);
      continue;
    }
    if (photo.sha256 !== null && sha256Of(await readFile(file)) !== photo.sha256) damaged.push(photo.key);
  }
  if (absent.length) {
    throw new RestoreRefusedError(
      'photos-missing',
      `The backup's photo folder ${folder} lacks ${absent.length} of the ${photos.length} photograph files its database refers to (first: ${absent[0]}).`,
    );
  }
  if (damaged.length) {
    const fullSize = photos.filter((photo) => photo.sha256 !== null).length;
    throw new RestoreRefusedError(
      'photos-damaged',
      `In the backup's photo folder ${folder}, ${damaged.length} of the ${fullSize} photographs differ from the checksums kept in its database (first: ${damaged[0]}).`,
    );
  }
  const staging = `${uploadsDir}.restoring`;
  await rm(staging, { recursive: true, force: true });
  // The live folder's permissions, so the server reads the restored files as it read its own.
  await mkdir(staging, { mode: existsSync(uploadsDir) ? statSync(uploadsDir).mode & 0o777 : 0o700 });
  const writer = new PhotoTreeWriter(folder, staging);
  const present = [...new Set(photos.map((photo) => photo.key))].filter((key) => !knownMissing.has(key) || existsSync(path.join(folder, key)));
  try {
    for (const key of present) {
      if (!(await writer.add(key))) throw new Error(`The photograph ${key} vanished from ${folder} during the restore.`);
    }
  } catch (error) {
    // Nothing live was touched yet: leave nothing half-made beside it either.
    await rm(staging, { recursive: true, force: true });
    throw error;
  }
  const report = {
    kind: 'restored' as const,
    folder,
    uploadsDir,
    files: writer.files,
    bytes: writer.bytes,
    linked: writer.linked,
    copied: writer.copied,
    knownMissing: [...knownMissing].filter((key) => !existsSync(path.join(folder, key))),
  };
  return { staged: { report, staging }, report };
}

/** The uploads folder swapped for the staged one; `undo` puts the old one back, `finish` deletes it. */
export interface PhotoSwap {
  /** Where the old uploads folder was set aside; null when there was none. */
  readonly aside: string | null;
  undo(): Promise<void>;
  finish(): Promise<void>;
}

/**
 * Puts the staged tree in place of the uploads folder with two renames in one folder (the old one
 * set aside as `<uploads>.replaced-<ms>`), so the uploads folder is at every moment either the old
 * tree or the restored one, never a mixture.
 */
export async function swapInPhotos(staged: StagedPhotos): Promise<PhotoSwap> {
  const { uploadsDir } = staged.report;
  const hasOld = await stat(uploadsDir).then(
    () => true,
    () => false,
  );
  const aside = `${uploadsDir}.replaced-${Date.now()}`;
  if (hasOld) await rename(uploadsDir, aside);
  try {
    await rename(staged.staging, uploadsDir);
  } catch (error) {
    // Never leave the server without its uploads folder: the old one goes back before the error travels on.
    if (hasOld) await rename(aside, uploadsDir);
    throw error;
  }
  return {
    aside: hasOld ? aside : null,
    undo: async () => {
      await rm(uploadsDir, { recursive: true, force: true });
      if (hasOld) await rename(aside, uploadsDir);
    },
    finish: async () => {
      if (hasOld) await rm(aside, { recursive: true, force: true });
    },
  };
}

/** What a restore did with the photographs, in lines for `npm run restore`. */
export function describePhotoRestore(photos: PhotoRestore, safetyPhotos: string | null): string[] {
  switch (photos.kind) {
    case 'object-storage':
      return ['Photographs: left as they are — they are kept in object storage (S3_BUCKET); bring back earlier versions with the bucket’s own versioning.'];
    case 'not-reported':
      return ['Photographs: left as they are (where they are kept was not given).'];
    case 'no-photo-folder':
      return [
        `Warning: this backup has no photo folder (${photos.folder} — it was taken before backups included photographs), so only the database was restored and ${photos.uploadsDir} was left as it is; ${photos.absentFromUploads} of the ${photos.referenced} photograph files the restored database refers to are not there.`,
      ];
    case 'restored': {
      const lines = [
        `Photographs: ${photos.files} files restored into ${photos.uploadsDir} from ${photos.folder} (${photos.linked} hard-linked, ${photos.copied} copied).${safetyPhotos ? ` Those of before are kept in ${safetyPhotos}.` : ''}`,
      ];
      if (photos.knownMissing.length) {
        lines.push(`Warning: ${photos.knownMissing.length} photograph files were already missing when the backup was taken (first: ${photos.knownMissing[0]}); they are still missing.`);
      }
      return lines;
    }
  }
}
