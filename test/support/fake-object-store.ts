import { DeleteObjectCommand, GetObjectCommand, NoSuchKey, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { mockClient } from 'aws-sdk-client-mock';

/** One stored object of the fake bucket. */
export interface FakeObject {
  bytes: Buffer;
  contentType: string | undefined;
  serverSideEncryption: string | undefined;
}

/**
 * A local stand-in for S3: a real `S3Client` whose `send` is intercepted by
 * aws-sdk-client-mock (no network, no cloud) and answered from an in-memory map
 * keyed `bucket/key`, with S3's semantics for the three calls Tidemark makes
 * (GetObject of a missing key throws NoSuchKey; DeleteObject of one succeeds).
 */
export class FakeObjectStore {
  readonly client = new S3Client({ region: 'us-east-1', credentials: { accessKeyId: 'test', secretAccessKey: 'test' } });
  readonly objects = new Map<string, FakeObject>();
  private readonly mock = mockClient(this.client);

  constructor() {
    this.mock.on(PutObjectCommand).callsFake((input: PutObjectCommand['input']) => {
      const body = input.Body;
      if (!Buffer.isBuffer(body)) throw new Error('The fake store expects Buffer bodies.');
      this.objects.set(`${input.Bucket}/${input.Key}`, { bytes: Buffer.from(body), contentType: input.ContentType, serverSideEncryption: input.ServerSideEncryption });
      return { ETag: '"fake"' };
    });
    this.mock.on(GetObjectCommand).callsFake((input: GetObjectCommand['input']) => {
      const found = this.objects.get(`${input.Bucket}/${input.Key}`);
      if (!found) throw new NoSuchKey({ message: 'The specified key does not exist.', $metadata: { httpStatusCode: 404 } });
      return { Body: { transformToByteArray: async () => new Uint8Array(found.bytes) }, ContentType: found.contentType };
    });
    this.mock.on(DeleteObjectCommand).callsFake((input: DeleteObjectCommand['input']) => {
      this.objects.delete(`${input.Bucket}/${input.Key}`);
      return {};
    });
  }

  /** Number of SDK calls of one kind so far. */
  calls(command: typeof PutObjectCommand | typeof GetObjectCommand | typeof DeleteObjectCommand): number {
    return this.mock.commandCalls(command).length;
  }

  /** Stops intercepting (restores the client's own `send`). */
  restore(): void {
    this.mock.restore();
  }
}
