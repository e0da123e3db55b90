import type { Env } from '../env';
import { DiskBlobStore, type BlobStore } from './blob-store';
import { S3BlobStore } from './s3-blob-store';

/** The blob store the environment selects (BLOB_STORE): local disk, or an S3-compatible bucket. */
export function blobStoreOf(env: Env): BlobStore {
  if (env.BLOB_STORE === 'disk') return new DiskBlobStore(env.DATA_DIR);
  return new S3BlobStore(env.DATA_DIR, {
    bucket: env.S3_BUCKET!,
    region: env.S3_REGION,
    endpoint: env.S3_ENDPOINT,
    accessKeyId: env.S3_ACCESS_KEY_ID,
    secretAccessKey: env.S3_SECRET_ACCESS_KEY,
    forcePathStyle: env.S3_FORCE_PATH_STYLE,
  });
}
