import { constants } from 'node:fs';
import { copyFile, link as hardLink, mkdir, stat } from 'node:fs/promises';
import path from 'node:path';

/** Makes `to` a hard link to `from` (node's `fs.promises.link`); tests pass one that fails as another filesystem would. */
export type LinkFile = (from: string, to: string) => Promise<void>;

/**
 * Errors with which a filesystem refuses a hard link that a copy can stand in for: another
 * device (EXDEV), a filesystem without links (EPERM on FAT/exFAT, ENOTSUP, EOPNOTSUPP, ENOSYS),
 * a file already at its link limit (EMLINK). See link(2).
 */
const LINK_REFUSALS = new Set(['EXDEV', 'EPERM', 'ENOTSUP', 'EOPNOTSUPP', 'ENOSYS', 'EMLINK']);

function errorCode(error: unknown): string | undefined {
  return error instanceof Error && 'code' in error && typeof error.code === 'string' ? error.code : undefined;
}

/**
 * Places photograph files from one tree (`<from>/<key>`) into another (`<to>/<key>`), as hard links
 * where the filesystem allows and as copies otherwise. A hard link is a snapshot of a photograph
 * because Tidemark never writes into a stored photograph again: every upload gets a new random key
 * (`photo.service.ts`), and removing a file only drops one name of it, so the other tree keeps the
 * bytes. Once a link is refused, every later file is copied straight away (the refusal is a
 * property of the two folders, not of one file).
 */
export class PhotoTreeWriter {
  /** Files placed as hard links. */
  linked = 0;
  /** Files placed as copies. */
  copied = 0;
  /** Bytes of all placed files. */
  bytes = 0;
  private isLinking = true;
  private readonly madeFolders = new Set<string>();

  constructor(
    private readonly from: string,
    private readonly to: string,
    private readonly linkFile: LinkFile = hardLink,
  ) {}

  /** Files placed so far. */
  get files(): number {
    return this.linked + this.copied;
  }

  /**
   * Places one file (the key is a storage key, already checked by the caller).
   *
   * @returns false when `<from>/<key>` does not exist (nothing is placed)
   */
  async add(key: string): Promise<boolean> {
    const source = path.join(this.from, key);
    const size = (await stat(source).catch((error: unknown) => {
      // Missing is an answer the caller reports; any other failure (permissions, I/O) is not.
      if (errorCode(error) === 'ENOENT') return null;
      throw error;
    }))?.size;
    if (size === undefined) return false;
    const target = path.join(this.to, key);
    const folder = path.dirname(target);
    if (!this.madeFolders.has(folder)) {
      await mkdir(folder, { recursive: true, mode: 0o700 });
      this.madeFolders.add(folder);
    }
    if (this.isLinking) {
      try {
        await this.linkFile(source, target);
        this.linked += 1;
        this.bytes += size;
        return true;
      } catch (error) {
        // Only a filesystem that cannot link falls back to copying; anything else is a real failure.
        if (!LINK_REFUSALS.has(errorCode(error) ?? '')) throw error;
        this.isLinking = false;
      }
    }
    // FICLONE: a copy-on-write clone where the filesystem offers one (btrfs, XFS), a plain copy elsewhere.
    await copyFile(source, target, constants.COPYFILE_FICLONE);
    this.copied += 1;
    this.bytes += size;
    return true;
  }
}
