import { createHash } from 'node:crypto';
import { readdirSync } from 'node:fs';
import path from 'node:path';
import sharp from 'sharp';
import { PHOTO_MAX_BYTES, type CaseDetail, type PhotoView } from '@tidemark/shared';
import {
  clinicalFingerprint,
  countRows,
  createCase,
  createClinicalWorld,
  describeAccessMatrix,
  expectStatus,
  visitBody,
  type AccessRoute,
  type ClinicalWorld,
} from './support/clinical-fixtures';
import type { ApiClient } from './support/test-app';

/**
 * A 64 × 48 JPEG from "TestCam" with EXIF orientation 6 (rotate 90° clockwise to display) and a GPS
 * latitude of 51° 30′ N. sharp writes the Orientation tag from `withMetadata({ orientation })`; an
 * Orientation inside `withExif` is overwritten by it, so the two are set separately.
 */
async function jpegWithExif(): Promise<Buffer> {
  return sharp({ create: { width: 64, height: 48, channels: 3, background: '#888' } })
    .jpeg()
    .withMetadata({ orientation: 6 })
    .withExif({ IFD0: { Make: 'TestCam' }, IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 0/1' } })
    .toBuffer();
}

/** True when a raw EXIF block (`Exif\0\0` + TIFF) has a GPS IFD pointer (tag 0x8825) in IFD0 (TIFF 6.0 / EXIF 2.3 layout). */
function hasGpsIfd(exif: Buffer): boolean {
  const tiff = exif.subarray(6);
  const isLittle = tiff.toString('latin1', 0, 2) === 'II';
  const u16 = (offset: number) => (isLittle ? tiff.readUInt16LE(offset) : tiff.readUInt16BE(offset));
  const u32 = (offset: number) => (isLittle ? tiff.readUInt32LE(offset) : tiff.readUInt32BE(offset));
  const ifd0 = u32(4);
  const entries = u16(ifd0);
  for (let index = 0; index < entries; index += 1) {
    if (u16(ifd0 + 2 + index * 12) === 0x8825) return true;
  }
  return false;
}

/** Files under the test app's uploads folder. */
function storedFiles(w: ClinicalWorld): string[] {
  try {
    return readdirSync(path.join(w.t.dataDir, 'uploads'), { recursive: true, withFileTypes: true })
      .filter((entry) => entry.isFile())
      .map((entry) => path.join(entry.parentPath, entry.name));
  } catch {
    // No upload yet: the folder does not exist.
    return [];
  }
}

/** A tiny valid PNG for set-up uploads. */
const smallPng = () => sharp({ create: { width: 8, height: 8, channels: 3, background: '#4a9' } }).png().toBuffer();

async function uploadPhoto(client: ApiClient, caseId: number, bytes: Buffer, filename = 'photo.jpg', contentType = 'image/jpeg', fields: Record<string, string> = { kind: 'recall' }) {
  return client.upload(`/api/cases/${caseId}/photos`, fields, { bytes, filename, contentType });
}

async function photoOnCaseOf(w: ClinicalWorld, ownerId: number): Promise<PhotoView> {
  const found = await createCase(w.as('audit_lead'), ownerId);
  return expectStatus(await uploadPhoto(w.as('audit_lead'), found.id, await smallPng(), 'p.png', 'image/png'), 201).body as PhotoView;
}

const ROUTES: AccessRoute[] = [
  {
    name: 'POST /api/cases/:id/photos',
    kind: 'write',
    success: 201,
    prepare: async (w, ownerId) => {
      const found = await createCase(w.as('audit_lead'), ownerId);
      const bytes = await smallPng();
      return (client) => uploadPhoto(client, found.id, bytes, 'p.png', 'image/png');
    },
  },
  {
    name: 'GET /api/photos/:id',
    kind: 'read',
    success: 200,
    prepare: async (w, ownerId) => {
      const photo = await photoOnCaseOf(w, ownerId);
      return (client) => client.get(`/api/photos/${photo.id}`);
    },
  },
  {
    name: 'GET /api/photos/:id/thumbnail',
    kind: 'read',
    success: 200,
    prepare: async (w, ownerId) => {
      const photo = await photoOnCaseOf(w, ownerId);
      return (client) => client.get(`/api/photos/${photo.id}/thumbnail`);
    },
  },
];

describe('photos: access for every role (DESIGN.md §2, §7)', () => {
  let world: ClinicalWorld;
  beforeAll(async () => {
    world = await createClinicalWorld();
  });
  afterAll(async () => {
    await world.close();
  });
  describeAccessMatrix(() => world, ROUTES);
});

describe('photos: content checks, metadata stripping and serving (DESIGN.md §7)', () => {
  let w: ClinicalWorld;
  let found: CaseDetail;
  beforeAll(async () => {
    w = await createClinicalWorld();
    found = await createCase(w.as('clinician'), w.ids.clinician);
  });
  afterAll(async () => {
    await w.close();
  });

  it('strips EXIF and GPS, applies the orientation, and serves the stored bytes with their sha256', async () => {
    const original = await jpegWithExif();
    const originalMeta = await sharp(original).metadata();
    // The test input really carries what must be removed.
    expect(originalMeta).toEqual(expect.objectContaining({ width: 64, height: 48, orientation: 6 }));
    expect(originalMeta.exif).toBeDefined();
    expect(hasGpsIfd(originalMeta.exif as Buffer)).toBe(true);
    expect(original.includes(Buffer.from('TestCam'))).toBe(true);

    const response = await uploadPhoto(w.as('clinician'), found.id, original, 'IMG_0001.JPG', 'image/jpeg', { kind: 'pre-operative', monthTaken: '2025-01' });
    expect(response.status, JSON.stringify(response.body)).toBe(201);
    const photo = response.body as PhotoView;
    // Orientation 6 displays rotated by 90°: 64 × 48 becomes 48 × 64.
    expect(photo).toEqual(
      expect.objectContaining({ kind: 'pre-operative', contentType: 'image/jpeg', width: 48, height: 64, monthTaken: '2025-01', visitId: null, uploadedBy: { id: w.ids.clinician, displayName: 'Dr Cal Clinician (demo)' } }),
    );

    const download = await w.as('clinician').getBytes(`/api/photos/${photo.id}`);
    expect(download.status).toBe(200);
    expect(download.headers['content-type']).toBe('image/jpeg');
    const bytes = download.body as Buffer;
    const meta = await sharp(bytes).metadata();
    expect(meta.exif).toBeUndefined();
    expect(meta.orientation).toBeUndefined();
    expect([meta.width, meta.height]).toEqual([48, 64]);
    expect(bytes.includes(Buffer.from('TestCam'))).toBe(false);
    expect(photo.sha256).toBe(createHash('sha256').update(bytes).digest('hex'));
    expect(photo.bytes).toBe(bytes.length);

    const detail = (await w.as('clinician').get(`/api/cases/${found.id}`)).body as CaseDetail;
    expect(detail.photos.map((item) => item.id)).toEqual([photo.id]);
  });

  it('serves a WebP thumbnail without metadata', async () => {
    const photo = expectStatus(await uploadPhoto(w.as('clinician'), found.id, await jpegWithExif()), 201).body as PhotoView;
    const thumbnail = await w.as('clinician').getBytes(`/api/photos/${photo.id}/thumbnail`);
    expect(thumbnail.status).toBe(200);
    expect(thumbnail.headers['content-type']).toBe('image/webp');
    const meta = await sharp(thumbnail.body as Buffer).metadata();
    expect(meta.format).toBe('webp');
    expect(meta.exif).toBeUndefined();
  });

  it('links a photograph to a visit of the case, and refuses a visit of another case', async () => {
    const withVisit = expectStatus(await w.as('clinician').post(`/api/cases/${found.id}/visits`, visitBody([{ siteId: found.sites[0].id, refGm: 9.5 }])), 201).body as CaseDetail;
    const visitId = withVisit.visits[0].id;
    const linked = await uploadPhoto(w.as('clinician'), found.id, await smallPng(), 'p.png', 'image/png', { kind: 'recall', visitId: String(visitId) });
    expect(linked.status).toBe(201);
    expect(linked.body.visitId).toBe(visitId);
    const otherCase = await createCase(w.as('clinician'), w.ids.clinician);
    const before = await countRows(w.t, 'photo');
    const files = storedFiles(w).length;
    const refused = await uploadPhoto(w.as('clinician'), otherCase.id, await smallPng(), 'p.png', 'image/png', { kind: 'recall', visitId: String(visitId) });
    expect(refused.status).toBe(400);
    expect(Object.keys(refused.body.error.fields)).toEqual(['visitId']);
    expect(await countRows(w.t, 'photo')).toBe(before);
    expect(storedFiles(w)).toHaveLength(files);
  });

  it('refuses a visit id in any but canonical decimal form (0x1, +1, 01…): 400 naming visitId', async () => {
    // Canonical decimal ids only, the rule of route ids (server/routes/route-params.ts). Each form below names a real
    // visit of this very case, so only the form can make the refusal; `0x1` itself is refused too.
    const own = await createCase(w.as('clinician'), w.ids.clinician);
    const withVisit = expectStatus(await w.as('clinician').post(`/api/cases/${own.id}/visits`, visitBody([{ siteId: own.sites[0].id, refGm: 9.5 }])), 201).body as CaseDetail;
    const id = withVisit.visits[0].id;
    const bytes = await smallPng();
    for (const visitId of ['0x1', `0x${id.toString(16)}`, `+${id}`, `0${id}`, `${id}e0`, ` ${id}`, `${id}.0`]) {
      const response = await expectRefused(() => uploadPhoto(w.as('clinician'), own.id, bytes, 'p.png', 'image/png', { kind: 'recall', visitId }), 400, 'validation');
      expect(Object.keys(response.body.error.fields ?? {}), visitId).toEqual(['visitId']);
    }
    // The canonical form of the same id is accepted.
    expect((await uploadPhoto(w.as('clinician'), own.id, bytes, 'p.png', 'image/png', { kind: 'recall', visitId: String(id) })).status).toBe(201);
  });

  /** Uploads and expects a refusal with nothing stored, neither row nor file. */
  async function expectRefused(upload: () => Promise<{ status: number; body: { error: { code: string; fields?: Record<string, string> } } }>, status: number, code: string) {
    const before = await clinicalFingerprint(w.t);
    const files = storedFiles(w).length;
    const response = await upload();
    expect(response.status, JSON.stringify(response.body)).toBe(status);
    expect(response.body.error.code).toBe(code);
    expect(await clinicalFingerprint(w.t)).toEqual(before);
    expect(storedFiles(w)).toHaveLength(files);
    return response;
  }

  it('refuses a PDF sent as a JPEG (checked by content, not by name or declared type): 415', async () => {
    const pdf = Buffer.from('%PDF-1.4\n1 0 obj\n<< /Type /Catalog >>\nendobj\ntrailer\n<< /Root 1 0 R >>\n%%EOF\n', 'latin1');
    await expectRefused(() => uploadPhoto(w.as('clinician'), found.id, pdf, 'scan.jpg', 'image/jpeg'), 415, 'unsupported_media_type');
  });

  it('refuses an ELF executable named x.jpg: 415', async () => {
    // ELF header: 0x7F 'E' 'L' 'F', 64-bit, little-endian, version 1, then padding (System V ABI).
    const elf = Buffer.concat([Buffer.from([0x7f, 0x45, 0x4c, 0x46, 0x02, 0x01, 0x01, 0x00]), Buffer.alloc(120, 0)]);
    elf.writeUInt16LE(2, 16); // e_type: executable
    elf.writeUInt16LE(0x3e, 18); // e_machine: x86-64
    await expectRefused(() => uploadPhoto(w.as('clinician'), found.id, elf, 'x.jpg', 'image/jpeg'), 415, 'unsupported_media_type');
  });

  it('refuses a Windows executable named x.jpg: 415', async () => {
    // DOS header "MZ" with e_lfanew = 0x40 pointing at a "PE\0\0" signature (Microsoft PE format).
    const exe = Buffer.alloc(256, 0);
    exe.write('MZ', 0, 'latin1');
    exe.writeUInt32LE(0x40, 0x3c);
    exe.write('PE\0\0', 0x40, 'latin1');
    await expectRefused(() => uploadPhoto(w.as('clinician'), found.id, exe, 'x.jpg', 'image/jpeg'), 415, 'unsupported_media_type');
  });

  it('refuses a truncated JPEG that only starts like one: 415', async () => {
    const real = await jpegWithExif();
    await expectRefused(() => uploadPhoto(w.as('clinician'), found.id, real.subarray(0, 200), 'cut.jpg'), 415, 'unsupported_media_type');
  });

  it('refuses an upload over 15 MB: 413', async () => {
    const oversized = Buffer.alloc(PHOTO_MAX_BYTES + 1, 0);
    Buffer.from([0xff, 0xd8, 0xff, 0xe0]).copy(oversized);
    await expectRefused(() => uploadPhoto(w.as('clinician'), found.id, oversized, 'big.jpg'), 413, 'payload_too_large');
  });

  it('refuses a request without a file: 400 naming the file', async () => {
    const response = await expectRefused(() => w.as('clinician').upload(`/api/cases/${found.id}/photos`, { kind: 'recall' }), 400, 'validation');
    expect(Object.keys(response.body.error.fields ?? {})).toEqual(['file']);
  });

  it('refuses an unknown photograph kind: 400 naming the kind', async () => {
    const bytes = await smallPng();
    const response = await expectRefused(() => uploadPhoto(w.as('clinician'), found.id, bytes, 'p.png', 'image/png', { kind: 'selfie' }), 400, 'validation');
    expect(Object.keys(response.body.error.fields ?? {})).toEqual(['kind']);
  });

  it("answers 404 to a clinician for another operator's photograph, and 403 to governance", async () => {
    const othersCase = await createCase(w.as('audit_lead'), w.ids.other);
    const photo = expectStatus(await uploadPhoto(w.as('other'), othersCase.id, await smallPng(), 'p.png', 'image/png'), 201).body as PhotoView;
    for (const suffix of ['', '/thumbnail']) {
      expect((await w.as('clinician').get(`/api/photos/${photo.id}${suffix}`)).status).toBe(404);
      expect((await w.as('governance').get(`/api/photos/${photo.id}${suffix}`)).status).toBe(403);
      expect((await w.as('other').get(`/api/photos/${photo.id}${suffix}`)).status).toBe(200);
    }
    expect((await w.as('clinician').get('/api/photos/999999')).status).toBe(404);
  });
});
