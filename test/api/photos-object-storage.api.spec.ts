import { createHash } from 'node:crypto';
import { existsSync } from 'node:fs';
import path from 'node:path';
import sharp from 'sharp';
import type { CaseDetail, PhotoView } from '@tidemark/shared';
import { S3PhotoStorage } from '../../server/storage/s3-photo-storage';
import { FakeObjectStore } from '../support/fake-object-store';
import { createCase, createClinicalWorld, expectStatus, type ClinicalWorld } from './support/clinical-fixtures';

describe('photographs in S3-compatible object storage (local stand-in, no cloud)', () => {
  let w: ClinicalWorld;
  let store: FakeObjectStore;
  let found: CaseDetail;
  beforeAll(async () => {
    store = new FakeObjectStore();
    w = await createClinicalWorld({ photoStorage: new S3PhotoStorage(store.client, { bucket: 'group-photos', prefix: 'site-a/' }) });
    found = await createCase(w.as('clinician'), w.ids.clinician);
  });
  afterAll(async () => {
    store.restore();
    await w.close();
  });

  it('stores the re-encoded photograph and its thumbnail as objects, nothing on the local disk', async () => {
    const png = await sharp({ create: { width: 40, height: 30, channels: 3, background: '#7a5' } }).png().toBuffer();
    const response = await w.as('clinician').upload(`/api/cases/${found.id}/photos`, { kind: 'recall' }, { bytes: png, filename: 'recall.png', contentType: 'image/png' });
    const photo = expectStatus(response, 201).body as PhotoView;

    const keys = [...store.objects.keys()].sort();
    expect(keys).toHaveLength(2);
    expect(keys[0]).toMatch(new RegExp(`^group-photos/site-a/${found.id}/[0-9a-f-]{36}-thumb\\.webp$`));
    expect(keys[1]).toMatch(new RegExp(`^group-photos/site-a/${found.id}/[0-9a-f-]{36}\\.png$`));
    expect(store.objects.get(keys[1])?.contentType).toBe('image/png');
    expect(existsSync(path.join(w.t.dataDir, 'uploads'))).toBe(false);

    const download = await w.as('clinician').getBytes(`/api/photos/${photo.id}`);
    expect(download.status).toBe(200);
    expect(download.headers['content-type']).toBe('image/png');
    const served = download.body as Buffer;
    expect(served).toEqual(store.objects.get(keys[1])?.bytes);
    expect(createHash('sha256').update(served).digest('hex')).toBe(photo.sha256);

    const thumbnail = await w.as('clinician').getBytes(`/api/photos/${photo.id}/thumbnail`);
    expect(thumbnail.status).toBe(200);
    expect((await sharp(thumbnail.body as Buffer).metadata()).format).toBe('webp');
  });

  it('refuses a file that is not an image before anything reaches the object store', async () => {
    const before = store.objects.size;
    const response = await w.as('clinician').upload(`/api/cases/${found.id}/photos`, { kind: 'recall' }, { bytes: Buffer.from('%PDF-1.7\n%âãÏÓ\n1 0 obj\n<<>>\nendobj\n'), filename: 'x.jpg' });
    expect(response.status).toBe(415);
    expect(store.objects.size).toBe(before);
  });
});
