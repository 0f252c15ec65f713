import { createHash } from 'node:crypto';
import { cpSync, existsSync, readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import type Database from 'better-sqlite3';
import sharp from 'sharp';
import { CLINICAL_TABLES } from '../../api/support/clinical-fixtures';
import { photoFolderOf } from '../../../server/maintenance/backup-photos';

/**
 * Photograph helpers of the backup and restore tests: distinct images to upload, and trees of
 * files compared by content.
 */

/** A 24 × 16 PNG of one colour picked by `seed`: different seeds, different bytes after the server's re-encoding. */
export function distinctPng(seed: number): Promise<Buffer> {
  const channel = (shift: number) => (seed * 47 + shift * 89) % 256;
  return sharp({ create: { width: 24, height: 16, channels: 3, background: { r: channel(1), g: channel(2), b: channel(3) } } })
    .png()
    .toBuffer();
}

/** Every file under `folder` (relative path → SHA-256 of its bytes); empty when the folder does not exist. */
export function photoTree(folder: string): Record<string, string> {
  if (!existsSync(folder)) return {};
  const entries = readdirSync(folder, { recursive: true, withFileTypes: true })
    .filter((entry) => entry.isFile())
    .map((entry) => {
      const file = path.join(entry.parentPath, entry.name);
      return [path.relative(folder, file), createHash('sha256').update(readFileSync(file)).digest('hex')] as const;
    })
    .sort(([a], [b]) => a.localeCompare(b));
  return Object.fromEntries(entries);
}

/** The keys (full size and thumbnail) of every photo row of an open database. */
export function photoKeysOf(db: Database.Database): string[] {
  return db
    .prepare<[], { storage_key: string; thumbnail_key: string }>('SELECT storage_key, thumbnail_key FROM photo ORDER BY id')
    .all()
    .flatMap((row) => [row.storage_key, row.thumbnail_key])
    .sort();
}

/** Every row of every clinical table, in id order: equal for two databases holding the same records. */
export function clinicalRows(db: Database.Database): Record<string, unknown[]> {
  return Object.fromEntries(CLINICAL_TABLES.map((table) => [table, db.prepare(`SELECT * FROM ${table} ORDER BY id`).all()]));
}

/** Copies a backup and its photo folder (when it has one) to `<name>.sqlite` and `<name>-photos` in `folder`, for a test to spoil. */
export function copyBackup(backupFile: string, folder: string, name: string): string {
  const file = path.join(folder, `${name}.sqlite`);
  cpSync(backupFile, file);
  if (existsSync(photoFolderOf(backupFile))) cpSync(photoFolderOf(backupFile), photoFolderOf(file), { recursive: true });
  return file;
}
