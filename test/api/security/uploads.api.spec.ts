import { existsSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { crc32, deflateSync } from 'node:zlib';
import sharp from 'sharp';
import type { PhotoView } from '@tidemark/shared';
import { PHOTO_MAX_PIXELS } from '@tidemark/shared';
import { createCase, createClinicalWorld, type ClinicalWorld } from '../support/clinical-fixtures';
import type { ApiClient } from '../support/test-app';
import { queryRows } from '../support/test-database';
import { databaseFingerprint } from './route-call-context';

/*
 * Photograph uploads against hostile files (DESIGN.md §7: checked by content, size-limited,
 * stored outside the web root). Size over 15 MB (413), wrong content (415) and another
 * operator's photograph (404) are covered in test/api/photos.api.spec.ts; this adds
 * decompression bombs, an SVG, a second file, and file names that try to become paths.
 */

/** Server-generated storage keys: `<case id>/<UUID v4>.<ext>`, thumbnails `-thumb.webp` (server/services/photo.service.ts). */
const UUID = '[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}';

/** One PNG chunk: length, type, data, CRC-32 over type and data (PNG, ISO/IEC 15948 §5.3). */
function pngChunk(type: string, data: Buffer): Buffer {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const typeAndData = Buffer.concat([Buffer.from(type, 'latin1'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(typeAndData) >>> 0);
  return Buffer.concat([length, typeAndData, crc]);
}

/**
 * A ~100-byte PNG whose header declares `width` × `height` 8-bit RGB pixels (IHDR, ISO/IEC 15948
 * §11.2.2), with one compressed row of image data: decoded in full it would need width × height × 3 bytes.
 */
function pngBomb(width: number, height: number): Buffer {
  const header = Buffer.alloc(13);
  header.writeUInt32BE(width, 0);
  header.writeUInt32BE(height, 4);
  header.writeUInt8(8, 8); // bit depth
  header.writeUInt8(2, 9); // colour type 2: truecolour
  const row = deflateSync(Buffer.alloc(1 + width * 3));
  return Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), pngChunk('IHDR', header), pngChunk('IDAT', row), pngChunk('IEND', Buffer.alloc(0))]);
}

/**
 * A small real JPEG whose baseline frame header (SOF0, marker FFC0: length, precision, then
 * height and width as 16-bit big-endian; ITU-T T.81 §B.2.2) is rewritten to `width` × `height`.
 */
async function jpegBomb(width: number, height: number): Promise<Buffer> {
  const bytes = Buffer.from(await sharp({ create: { width: 16, height: 16, channels: 3, background: '#a86' } }).jpeg({ mozjpeg: false }).toBuffer());
  for (let offset = 2; offset < bytes.length - 9; offset++) {
    if (bytes[offset] === 0xff && bytes[offset + 1] === 0xc0) {
      bytes.writeUInt16BE(height, offset + 5);
      bytes.writeUInt16BE(width, offset + 7);
      return bytes;
    }
  }
  throw new Error('No SOF0 marker in the JPEG');
}

/**
 * A real 16 × 16 lossy WebP whose VP8 key-frame header (start code 9D 01 2A, then width and
 * height as 14-bit little-endian fields; RFC 6386 §9.1) is rewritten to the format's largest
 * size, 16383 × 16383 (268 megapixels).
 */
async function webpBomb(): Promise<Buffer> {
  const bytes = Buffer.from(await sharp({ create: { width: 16, height: 16, channels: 3, background: '#6a8' } }).webp().toBuffer());
  const start = bytes.indexOf(Buffer.from([0x9d, 0x01, 0x2a]));
  if (start < 0) throw new Error('No VP8 key frame in the WebP');
  bytes.writeUInt16LE(16383, start + 3);
  bytes.writeUInt16LE(16383, start + 5);
  return bytes;
}

/** Every file under a folder, as paths relative to it. */
function filesUnder(root: string): string[] {
  if (!existsSync(root)) return [];
  return readdirSync(root, { recursive: true, withFileTypes: true })
    .filter((entry) => entry.isFile())
    .map((entry) => path.relative(root, path.join(entry.parentPath, entry.name)))
    .sort();
}

/**
 * A multipart body built byte by byte (RFC 7578), so the file name reaches the server exactly
 * as written — a test client would escape or drop what matters here.
 */
function multipart(boundary: string, parts: { name: string; value?: string; filename?: string; contentType?: string; bytes?: Buffer }[]): Buffer {
  const chunks: Buffer[] = [];
  for (const part of parts) {
    const disposition = `Content-Disposition: form-data; name="${part.name}"${part.filename === undefined ? '' : `; filename="${part.filename}"`}`;
    const type = part.contentType ? `\r\nContent-Type: ${part.contentType}` : '';
    chunks.push(Buffer.from(`--${boundary}\r\n${disposition}${type}\r\n\r\n`, 'latin1'), part.bytes ?? Buffer.from(part.value ?? '', 'utf8'), Buffer.from('\r\n', 'latin1'));
  }
  chunks.push(Buffer.from(`--${boundary}--\r\n`, 'latin1'));
  return Buffer.concat(chunks);
}

async function sendMultipart(client: ApiClient, url: string, body: Buffer, boundary: string) {
  if (!client.xsrf) await client.get('/api/auth/me');
  return client.agent.post(url).set('X-XSRF-TOKEN', client.xsrf).set('Content-Type', `multipart/form-data; boundary=${boundary}`).send(body);
}

describe('photo uploads: hostile files (DESIGN.md §7)', () => {
  let w: ClinicalWorld;
  let caseId: number;
  let jpeg: Buffer;

  beforeAll(async () => {
    w = await createClinicalWorld();
    caseId = (await createCase(w.as('clinician'), w.ids.clinician)).id;
    jpeg = await sharp({ create: { width: 24, height: 16, channels: 3, background: '#789' } }).jpeg().toBuffer();
  });
  afterAll(async () => {
    await w.close();
  });

  it('keeps the decompression-bomb guard in the photo service: 60 megapixels', () => {
    // shared/schemas/photo.ts; the service hands it to sharp as limitInputPixels.
    expect(PHOTO_MAX_PIXELS).toBe(60_000_000);
  });

  const bombs: [string, () => Promise<Buffer>, string][] = [
    ['a PNG declaring 30000 × 30000 pixels (900 MP, 2.7 GB decoded)', async () => pngBomb(30_000, 30_000), 'bomb.png'],
    ['a PNG declaring 7746 × 7746 pixels (60,000,516: just over the limit)', async () => pngBomb(7746, 7746), 'edge.png'],
    ['a JPEG declaring 30000 × 30000 pixels', () => jpegBomb(30_000, 30_000), 'bomb.jpg'],
    ['a WebP declaring 16383 × 16383 pixels', webpBomb, 'bomb.webp'],
  ];
  for (const [name, make, filename] of bombs) {
    it(`refuses ${name} with 413, fast and without decoding it, storing nothing`, async () => {
      const bytes = await make();
      expect(bytes.length).toBeLessThan(200_000);
      const before = await databaseFingerprint(w);
      const filesBefore = filesUnder(w.t.dataDir);
      const rssBefore = process.memoryUsage().rss;
      const started = performance.now();
      const response = await w.as('clinician').upload(`/api/cases/${caseId}/photos`, { kind: 'recall' }, { bytes, filename, contentType: 'image/png' });
      const elapsedMs = performance.now() - started;
      expect(response.status, JSON.stringify(response.body)).toBe(413);
      expect(response.body.error.code).toBe('payload_too_large');
      // Decoding 900 MP would take seconds and gigabytes; the header check takes milliseconds (common practice: bound by pixels before decoding).
      expect(elapsedMs).toBeLessThan(2000);
      expect(process.memoryUsage().rss - rssBefore).toBeLessThan(150 * 1024 * 1024);
      expect(await databaseFingerprint(w)).toEqual(before);
      expect(filesUnder(w.t.dataDir)).toEqual(filesBefore);
    });
  }

  it('refuses an SVG (script-capable markup) named photo.jpg: 415', async () => {
    const svg = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><script>alert(1)</script></svg>');
    const before = await databaseFingerprint(w);
    const response = await w.as('clinician').upload(`/api/cases/${caseId}/photos`, { kind: 'recall' }, { bytes: svg, filename: 'photo.jpg', contentType: 'image/jpeg' });
    expect(response.status).toBe(415);
    expect(response.body.error.code).toBe('unsupported_media_type');
    expect(await databaseFingerprint(w)).toEqual(before);
  });

  it('refuses two files in one upload: 400, nothing stored', async () => {
    const boundary = 'tidemark-two-files';
    const body = multipart(boundary, [
      { name: 'kind', value: 'recall' },
      { name: 'file', filename: 'a.jpg', contentType: 'image/jpeg', bytes: jpeg },
      { name: 'file', filename: 'b.jpg', contentType: 'image/jpeg', bytes: jpeg },
    ]);
    const before = await databaseFingerprint(w);
    const filesBefore = filesUnder(w.t.dataDir);
    const response = await sendMultipart(w.as('clinician'), `/api/cases/${caseId}/photos`, body, boundary);
    expect(response.status, JSON.stringify(response.body)).toBe(400);
    expect(response.body.error.code).toBe('validation');
    expect(await databaseFingerprint(w)).toEqual(before);
    expect(filesUnder(w.t.dataDir)).toEqual(filesBefore);
  });

  // Found here: busboy's parse errors reached the error handler as 500s (fixed in cases.routes.ts and imports.routes.ts).
  const malformed: [string, string, (boundary: string) => Buffer][] = [
    ['a NUL byte in the file name (not allowed in a header, RFC 9110 §5.5)', 'tidemark-nul', (boundary) => multipart(boundary, [{ name: 'kind', value: 'recall' }, { name: 'file', filename: 'photo\u0000.jpg', contentType: 'image/jpeg', bytes: jpeg }])],
    ['a body cut off before its closing boundary', 'tidemark-cut', (boundary) => multipart(boundary, [{ name: 'kind', value: 'recall' }, { name: 'file', filename: 'a.jpg', contentType: 'image/jpeg', bytes: jpeg }]).subarray(0, 120)],
    ['a body whose parts use another boundary than the header names', 'tidemark-declared', () => multipart('tidemark-other', [{ name: 'kind', value: 'recall' }, { name: 'file', filename: 'a.jpg', contentType: 'image/jpeg', bytes: jpeg }])],
  ];
  for (const [name, boundary, make] of malformed) {
    it(`answers 400, not 500, to ${name}, on photos and imports, storing nothing`, async () => {
      const before = await databaseFingerprint(w);
      const filesBefore = filesUnder(w.t.dataDir);
      for (const [client, url] of [[w.as('clinician'), `/api/cases/${caseId}/photos`], [w.as('audit_lead'), '/api/imports']] as const) {
        const response = await sendMultipart(client, url, make(boundary), boundary);
        expect(response.status, `${url}: ${JSON.stringify(response.body)}`).toBe(400);
        expect(response.body.error.code).toBe('validation');
      }
      await w.t.imports.idle();
      expect(await databaseFingerprint(w)).toEqual(before);
      expect(filesUnder(w.t.dataDir)).toEqual(filesBefore);
    });
  }

  const hostileNames = ['../../etc/passwd.jpg', '..\\..\\x.jpg', '/tmp/tidemark-evil.jpg', '....//....//y.jpg', '%2e%2e%2fz.jpg', 'x.jpg/../../../w.jpg'];
  for (const filename of hostileNames) {
    it(`never uses the file name ${JSON.stringify(filename)} as a path: the key is the server's own`, async () => {
      const boundary = 'tidemark-hostile-name';
      const body = multipart(boundary, [
        { name: 'kind', value: 'recall' },
        { name: 'file', filename, contentType: 'image/jpeg', bytes: jpeg },
      ]);
      const filesBefore = filesUnder(w.t.dataDir);
      const response = await sendMultipart(w.as('clinician'), `/api/cases/${caseId}/photos`, body, boundary);
      expect(response.status, JSON.stringify(response.body)).toBe(201);
      const photo = response.body as PhotoView;
      expect(JSON.stringify(photo)).not.toMatch(/passwd|\.\.|evil|%2e/i);

      const [row] = await queryRows<{ storageKey: string; thumbnailKey: string }>(w.t.dataSource, 'SELECT storage_key AS "storageKey", thumbnail_key AS "thumbnailKey" FROM photo WHERE id = :id', { id: photo.id });
      expect(row.storageKey).toMatch(new RegExp(`^${caseId}/${UUID}\\.jpg$`));
      expect(row.thumbnailKey).toBe(row.storageKey.replace(/\.jpg$/, '-thumb.webp'));

      // Exactly the two files of those keys appeared, both inside uploads/.
      const added = filesUnder(w.t.dataDir).filter((file) => !filesBefore.includes(file));
      expect(added.sort()).toEqual([path.join('uploads', row.storageKey), path.join('uploads', row.thumbnailKey)].sort());
      const uploads = path.join(w.t.dataDir, 'uploads');
      for (const base of [uploads, path.join(uploads, String(caseId)), w.t.dataDir]) {
        for (const name of [filename, filename.replace(/\\/g, '/')]) expect(existsSync(path.resolve(base, name)), path.resolve(base, name)).toBe(false);
      }
    });
  }
});
