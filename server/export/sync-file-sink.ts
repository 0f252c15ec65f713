import { closeSync, openSync, writeSync } from 'node:fs';
import { Writable } from 'node:stream';

/**
 * A file written synchronously, chunk by chunk. exceljs' streaming writer pushes a sheet's XML
 * into its zip without waiting for the file (no backpressure), so with an ordinary file stream the
 * XML of a large sheet piles up in memory whenever the disk lags behind. Writing each chunk before
 * acknowledging it lets the zip pipeline empty within one turn of the event loop, so the rows in
 * flight stay a few hundred kilobytes whatever the size of the sheet.
 */
export class SyncFileSink extends Writable {
  private readonly fd: number;

  constructor(path: string) {
    super();
    this.fd = openSync(path, 'w', 0o600);
  }

  override _write(chunk: Buffer, _encoding: BufferEncoding, callback: (error?: Error | null) => void): void {
    try {
      let offset = 0;
      while (offset < chunk.length) offset += writeSync(this.fd, chunk, offset, chunk.length - offset);
      callback();
    } catch (error) {
      // Report through the stream so the writer's promise rejects instead of throwing out of a tick.
      callback(error instanceof Error ? error : new Error(String(error)));
    }
  }

  override _final(callback: (error?: Error | null) => void): void {
    this.closeFile(callback);
  }

  override _destroy(error: Error | null, callback: (error?: Error | null) => void): void {
    this.closeFile(() => callback(error));
  }

  private isClosed = false;

  private closeFile(callback: (error?: Error | null) => void): void {
    if (this.isClosed) return callback();
    this.isClosed = true;
    try {
      // No fsync: a crash loses the job anyway, and the next request starts it again.
      closeSync(this.fd);
      callback();
    } catch (error) {
      callback(error instanceof Error ? error : new Error(String(error)));
    }
  }
}
