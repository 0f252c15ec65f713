import archiver from 'archiver';
import ExcelJS from 'exceljs';
import { checkUnpackedSize } from './workbook-size-guard';

/** Builds a zip in memory with archiver (deflate level 9). */
async function zipOf(entries: { name: string; bytes: Buffer }[]): Promise<Buffer> {
  const archive = archiver('zip', { zlib: { level: 9 } });
  const chunks: Buffer[] = [];
  archive.on('data', (chunk: Buffer) => chunks.push(chunk));
  const ended = new Promise<void>((resolve, reject) => {
    archive.on('end', () => resolve());
    archive.on('error', reject);
  });
  for (const entry of entries) archive.append(entry.bytes, { name: entry.name });
  await archive.finalize();
  await ended;
  return Buffer.concat(chunks);
}

/**
 * Rewrites every declared uncompressed size to `size`, in the local headers (offset 22 after
 * the signature 50 4B 03 04) and the central directory (offset 24 after 50 4B 01 02), as laid
 * out in PKWARE's APPNOTE.TXT §4.3.7 and §4.3.12 (from memory). archiver writes sizes in a
 * data descriptor after each entry, so the local header fields may be zero already.
 */
function lieAboutSizes(zip: Buffer, size: number): Buffer {
  const copy = Buffer.from(zip);
  for (let at = 0; at < copy.length - 4; at += 1) {
    const signature = copy.readUInt32LE(at);
    if (signature === 0x02014b50) copy.writeUInt32LE(size, at + 24);
  }
  return copy;
}

const limits = { maxEntries: 50, maxUnpackedBytes: 1024 * 1024 };

describe('checkUnpackedSize (ASVS 5.0 5.2.3: unpacked size and entry count before parsing)', () => {
  it('accepts a real workbook written by exceljs', async () => {
    const workbook = new ExcelJS.Workbook();
    workbook.addWorksheet('Cases').addRows([['patient_code', 'surgery_date'], ['TM-DEMO-1', '2026-01-05']]);
    const bytes = Buffer.from(await workbook.xlsx.writeBuffer());
    await expect(checkUnpackedSize(bytes, limits)).resolves.toEqual({ ok: true });
  });

  it('refuses more entries than allowed', async () => {
    const entries = Array.from({ length: 51 }, (_, index) => ({ name: `xl/part${index}.xml`, bytes: Buffer.from('<a/>') }));
    await expect(checkUnpackedSize(await zipOf(entries), limits)).resolves.toEqual({ ok: false, reason: 'entries' });
  });

  it('refuses a small file that inflates past the limit (4 MB of zeros in a few kB)', async () => {
    const bomb = await zipOf([{ name: 'xl/worksheets/sheet1.xml', bytes: Buffer.alloc(4 * 1024 * 1024) }]);
    expect(bomb.length).toBeLessThan(16 * 1024);
    await expect(checkUnpackedSize(bomb, limits)).resolves.toEqual({ ok: false, reason: 'size' });
  });

  it('counts the bytes really inflated, so a central directory that understates sizes does not help', async () => {
    const bomb = lieAboutSizes(await zipOf([{ name: 'xl/worksheets/sheet1.xml', bytes: Buffer.alloc(4 * 1024 * 1024) }]), 100);
    await expect(checkUnpackedSize(bomb, limits)).resolves.toEqual({ ok: false, reason: 'size' });
  });

  it('calls bytes that are not a zip damaged (the workbook reader then says so in words)', async () => {
    await expect(checkUnpackedSize(Buffer.from('not a zip at all'), limits)).resolves.toEqual({ ok: false, reason: 'damaged' });
  });
});
