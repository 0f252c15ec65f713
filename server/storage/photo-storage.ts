import { mkdir, readFile, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { assertStorageKey } from './storage-key';

/**
 * Where photograph bytes live: the data dir by default ({@link LocalPhotoStorage}),
 * S3-compatible object storage when configured (`S3PhotoStorage`). Keys always have
 * the server's shape (see `storage-key.ts`).
 */
export interface PhotoStorage {
  put(key: string, bytes: Buffer): Promise<void>;
  get(key: string): Promise<Buffer>;
  remove(key: string): Promise<void>;
}

/** Files under `<dataDir>/uploads`, outside any folder the web server serves. */
export class LocalPhotoStorage implements PhotoStorage {
  constructor(private readonly root: string) {}

  private resolve(key: string): string {
    const full = path.resolve(this.root, assertStorageKey(key));
    if (!full.startsWith(path.resolve(this.root) + path.sep)) throw new Error(`Refusing storage key "${key}".`);
    return full;
  }

  async put(key: string, bytes: Buffer): Promise<void> {
    const full = this.resolve(key);
    await mkdir(path.dirname(full), { recursive: true });
    // 'wx': a stored photo is never overwritten (keys are fresh), so backups may hard-link it safely.
    await writeFile(full, bytes, { mode: 0o600, flag: 'wx' });
  }

  get(key: string): Promise<Buffer> {
    return readFile(this.resolve(key));
  }

  async remove(key: string): Promise<void> {
    await rm(this.resolve(key), { force: true });
  }
}
