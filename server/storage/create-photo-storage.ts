import { S3Client } from '@aws-sdk/client-s3';
import { LocalPhotoStorage, type PhotoStorage } from './photo-storage';
import { S3PhotoStorage } from './s3-photo-storage';

/** Where photographs live, as read from the environment by `loadConfig`. */
export type PhotoStorageConfig =
  | { kind: 'local'; dir: string }
  | { kind: 's3'; bucket: string; prefix: string; region: string; endpoint: string | null; forcePathStyle: boolean };

/**
 * Reads the photo storage settings: `S3_BUCKET` switches to object storage, with
 * `S3_REGION` (default us-east-1), `S3_ENDPOINT` (for MinIO and other S3-compatible
 * stores), `S3_FORCE_PATH_STYLE=true` and `S3_PREFIX`. Credentials come from the AWS
 * SDK's usual chain (`AWS_ACCESS_KEY_ID` / `AWS_SECRET_ACCESS_KEY`, a profile, or an
 * instance role) and are never read or logged by Tidemark.
 * @throws {Error} when S3_PREFIX is not a plain folder path
 */
export function photoStorageConfig(env: NodeJS.ProcessEnv, uploadsDir: string): PhotoStorageConfig {
  const bucket = env.S3_BUCKET?.trim();
  if (!bucket) return { kind: 'local', dir: uploadsDir };
  const prefix = env.S3_PREFIX?.trim() ?? '';
  if (prefix !== '' && !/^[A-Za-z0-9_-]+(\/[A-Za-z0-9_-]+)*\/$/.test(prefix)) {
    throw new Error(`S3_PREFIX must look like "folder/" or "a/b/" (letters, digits, - and _), got "${prefix}".`);
  }
  return {
    kind: 's3',
    bucket,
    prefix,
    region: env.S3_REGION?.trim() || 'us-east-1',
    endpoint: env.S3_ENDPOINT?.trim() || null,
    forcePathStyle: env.S3_FORCE_PATH_STYLE === 'true',
  };
}

/** Builds the configured storage; `client` lets tests pass an SDK client they control. */
export function createPhotoStorage(config: PhotoStorageConfig, client?: S3Client): PhotoStorage {
  if (config.kind === 'local') return new LocalPhotoStorage(config.dir);
  const s3 = client ?? new S3Client({ region: config.region, endpoint: config.endpoint ?? undefined, forcePathStyle: config.forcePathStyle });
  return new S3PhotoStorage(s3, { bucket: config.bucket, prefix: config.prefix });
}
