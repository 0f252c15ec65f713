import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3';
import { FakeObjectStore } from '../../test/support/fake-object-store';
import { createPhotoStorage, photoStorageConfig } from './create-photo-storage';
import { LocalPhotoStorage } from './photo-storage';
import { S3PhotoStorage } from './s3-photo-storage';

const KEY = '12/0b5e8f3c-2d4a-4f8e-9a71-5c3e2b1d0f44.jpg';

describe('S3PhotoStorage against a local stand-in (aws-sdk-client-mock)', () => {
  let store: FakeObjectStore;
  let storage: S3PhotoStorage;
  beforeEach(() => {
    store = new FakeObjectStore();
    storage = new S3PhotoStorage(store.client, { bucket: 'practice-photos', prefix: 'tidemark/' });
  });
  afterEach(() => store.restore());

  it('puts private, encrypted objects under the prefix with the content type of the key', async () => {
    await storage.put(KEY, Buffer.from('jpeg bytes'));
    expect([...store.objects.keys()]).toEqual([`practice-photos/tidemark/${KEY}`]);
    const stored = store.objects.get(`practice-photos/tidemark/${KEY}`);
    expect(stored?.bytes.toString()).toBe('jpeg bytes');
    expect(stored?.contentType).toBe('image/jpeg');
    expect(stored?.serverSideEncryption).toBe('AES256');
  });

  it('gets back the same bytes and removes them', async () => {
    const bytes = Buffer.from([0xff, 0xd8, 0xff, 0x00, 0x01, 0x02]);
    await storage.put(KEY, bytes);
    expect(await storage.get(KEY)).toEqual(bytes);
    await storage.remove(KEY);
    expect(store.objects.size).toBe(0);
    await expect(storage.get(KEY)).rejects.toThrow(/does not exist/);
  });

  it('removing a missing object succeeds, as on the local disk', async () => {
    await expect(storage.remove(KEY)).resolves.toBeUndefined();
    expect(store.calls(DeleteObjectCommand)).toBe(1);
  });

  it.each(['../../etc/passwd', '12/../../x.jpg', 'tidemark/12/a.jpg', '12/0b5e8f3c-2d4a-4f8e-9a71-5c3e2b1d0f44.exe', ''])(
    'refuses the key %j without calling the object store',
    async (key) => {
      await expect(storage.put(key, Buffer.from('x'))).rejects.toThrow(/Refusing storage key/);
      await expect(storage.get(key)).rejects.toThrow(/Refusing storage key/);
      expect(store.calls(PutObjectCommand) + store.calls(GetObjectCommand)).toBe(0);
    },
  );
});

describe('photoStorageConfig', () => {
  it('keeps the uploads dir when S3_BUCKET is not set', () => {
    expect(photoStorageConfig({}, '/data/uploads')).toEqual({ kind: 'local', dir: '/data/uploads' });
    expect(createPhotoStorage({ kind: 'local', dir: '/data/uploads' })).toBeInstanceOf(LocalPhotoStorage);
  });

  it('reads the S3 settings with defaults', () => {
    expect(photoStorageConfig({ S3_BUCKET: 'photos' }, '/x')).toEqual({ kind: 's3', bucket: 'photos', prefix: '', region: 'us-east-1', endpoint: null, forcePathStyle: false });
    expect(
      photoStorageConfig({ S3_BUCKET: 'photos', S3_PREFIX: 'group/site-a/', S3_REGION: 'eu-west-2', S3_ENDPOINT: 'http://127.0.0.1:9000', S3_FORCE_PATH_STYLE: 'true' }, '/x'),
    ).toEqual({ kind: 's3', bucket: 'photos', prefix: 'group/site-a/', region: 'eu-west-2', endpoint: 'http://127.0.0.1:9000', forcePathStyle: true });
    expect(createPhotoStorage({ kind: 's3', bucket: 'photos', prefix: '', region: 'eu-west-2', endpoint: null, forcePathStyle: false })).toBeInstanceOf(S3PhotoStorage);
  });

  it.each(['../', '/abs/', 'no-slash', 'a//b/'])('refuses the prefix %j', (prefix) => {
    expect(() => photoStorageConfig({ S3_BUCKET: 'photos', S3_PREFIX: prefix }, '/x')).toThrow(/S3_PREFIX/);
  });
});
