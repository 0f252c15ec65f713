/*
 * The few members of archiver 5 and unzipper 0.10 (both already installed as exceljs'
 * dependencies) that the workbook post-processor uses. Neither ships type declarations
 * and no @types package is installed, so these describe only what we call.
 */

declare module 'archiver' {
  import type { Readable, Transform } from 'node:stream';

  /** Options of the zip format. */
  interface ZipArchiveOptions {
    /** Deflate settings; level 0–9. */
    zlib?: { level?: number };
    /** Store every entry uncompressed. */
    store?: boolean;
  }

  /** Facts about one entry. */
  interface EntryData {
    name: string;
    date?: Date;
  }

  /** A zip being written; pipe it to a file and call `finalize()` after the last entry. */
  interface ZipArchive extends Transform {
    append(source: Readable | Buffer | string, data: EntryData): this;
    finalize(): Promise<void>;
  }

  function archiver(format: 'zip', options?: ZipArchiveOptions): ZipArchive;
  export default archiver;
}

declare module 'unzipper' {
  import type { Readable } from 'node:stream';

  /** One entry of a zip's central directory. */
  interface CentralDirectoryFile {
    path: string;
    type: 'File' | 'Directory';
    uncompressedSize: number;
    /** The entry's bytes, inflated, read from the file as they are consumed. */
    stream(): Readable;
    buffer(): Promise<Buffer>;
  }

  /** A zip opened by reading its central directory (random access; no data-descriptor scanning). */
  interface CentralDirectory {
    files: CentralDirectoryFile[];
  }

  const unzipper: {
    Open: { file(path: string): Promise<CentralDirectory>; buffer(data: Buffer): Promise<CentralDirectory> };
  };
  export default unzipper;
}
