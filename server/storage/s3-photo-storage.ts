import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand, type S3Client } from '@aws-sdk/client-s3';
import type { PhotoStorage } from './photo-storage';
import { assertStorageKey, contentTypeOfKey } from './storage-key';

/** Where in the object store photographs go. */
export interface S3Location {
  bucket: string;
  /** Folder-like prefix inside the bucket (e.g. `tidemark/photos/`); empty for the bucket root. */
  prefix: string;
}

/**
 * Photographs in S3-compatible object storage (AWS S3, MinIO, Ceph…) through the
 * official AWS SDK v3. Objects are private (no ACL is set; the bucket policy must not
 * make them public), encrypted at rest by the store (`ServerSideEncryption: AES256`),
 * and only ever served through Tidemark's authorised photo route, never by URL.
 */
export class S3PhotoStorage implements PhotoStorage {
  constructor(
    private readonly client: S3Client,
    private readonly location: S3Location,
  ) {}

  private objectKey(key: string): string {
    return `${this.location.prefix}${assertStorageKey(key)}`;
  }

  async put(key: string, bytes: Buffer): Promise<void> {
    await this.client.send(
      new PutObjectCommand({
        Bucket: this.location.bucket,
        Key: this.objectKey(key),
        Body: bytes,
        ContentType: contentTypeOfKey(key),
        ContentLength: bytes.length,
        ServerSideEncryption: 'AES256',
      }),
    );
  }

  async get(key: string): Promise<Buffer> {
    const answer = await this.client.send(new GetObjectCommand({ Bucket: this.location.bucket, Key: this.objectKey(key) }));
    if (!answer.Body) throw new Error(`Object storage returned no body for "${key}".`);
    return Buffer.from(await answer.Body.transformToByteArray());
  }

  async remove(key: string): Promise<void> {
    // S3 answers 204 for a missing object too, like LocalPhotoStorage's `force`.
    await this.client.send(new DeleteObjectCommand({ Bucket: this.location.bucket, Key: this.objectKey(key) }));
  }
}
