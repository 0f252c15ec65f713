import unzipper from 'unzipper';

/** Limits on what an uploaded .xlsx may unpack to (OWASP ASVS 5.0 5.2.3). */
export interface UnpackLimits {
  /** Most entries in the zip. A generated workbook has about ten. */
  maxEntries: number;
  /** Most bytes all entries may inflate to together. */
  maxUnpackedBytes: number;
}

/** 10,000 import rows × 40 columns unpack to about 25 MB of sheet XML; four times that is plenty. */
export const IMPORT_UNPACK_LIMITS: UnpackLimits = { maxEntries: 200, maxUnpackedBytes: 100 * 1024 * 1024 };

/** Why a workbook was refused before its XML was parsed. */
export type UnpackVerdict = { ok: true } | { ok: false; reason: 'entries' | 'size' | 'damaged' };

/**
 * Checks a zip before anything parses it: the entry count from the central directory, then
 * the bytes each entry really inflates to, counted while inflating and abandoned as soon
 * as the total passes the limit, so a declared size that lies (a zip bomb) cannot help it.
 * @param bytes the uploaded file
 */
export async function checkUnpackedSize(bytes: Buffer, limits: UnpackLimits = IMPORT_UNPACK_LIMITS): Promise<UnpackVerdict> {
  let directory: Awaited<ReturnType<typeof unzipper.Open.buffer>>;
  try {
    directory = await unzipper.Open.buffer(bytes);
  } catch {
    // Not a zip, or its central directory is cut off: the workbook reader reports it as damaged.
    return { ok: false, reason: 'damaged' };
  }
  if (directory.files.length > limits.maxEntries) return { ok: false, reason: 'entries' };
  const declared = directory.files.reduce((sum, file) => sum + file.uncompressedSize, 0);
  if (declared > limits.maxUnpackedBytes) return { ok: false, reason: 'size' };
  let total = 0;
  for (const file of directory.files) {
    if (file.type !== 'File') continue;
    const outcome = await new Promise<'ok' | 'size' | 'damaged'>((resolve) => {
      const stream = file.stream();
      stream.on('data', (chunk: Buffer) => {
        total += chunk.length;
        if (total > limits.maxUnpackedBytes) {
          stream.destroy();
          resolve('size');
        }
      });
      stream.on('end', () => resolve('ok'));
      stream.on('error', () => resolve('damaged'));
    });
    if (outcome !== 'ok') return { ok: false, reason: outcome };
  }
  return { ok: true };
}
