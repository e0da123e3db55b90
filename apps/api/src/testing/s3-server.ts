import fs from 'node:fs';
import { createRequire } from 'node:module';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';

/** The part of s3rver (an S3-compatible server on local disk, npm, no type declarations) the tests use. */
interface S3rverInstance {
  run(): Promise<AddressInfo>;
  close(): Promise<void>;
}
type S3rverClass = new (options: {
  address: string;
  port: number;
  silent: boolean;
  directory: string;
  configureBuckets: { name: string; configs: string[] }[];
}) => S3rverInstance;

export interface LocalS3 {
  endpoint: string;
  bucket: string;
  accessKeyId: string;
  secretAccessKey: string;
  /** Environment variables that point the API at this server. */
  env: Record<string, string>;
  close(): Promise<void>;
}

/** Starts s3rver on a random port with a fresh temp folder and one bucket; the real AWS SDK talks to it. */
export async function startLocalS3(bucket = 'revloop-test'): Promise<LocalS3> {
  const S3rver = createRequire(import.meta.url)('s3rver') as S3rverClass;
  const directory = fs.mkdtempSync(path.join(os.tmpdir(), 'revloop-s3-'));
  const server = new S3rver({ address: '127.0.0.1', port: 0, silent: true, directory, configureBuckets: [{ name: bucket, configs: [] }] });
  const address = await server.run();
  const endpoint = `http://127.0.0.1:${address.port}`;
  // s3rver accepts these fixed credentials when requests are signed.
  const accessKeyId = 'S3RVER';
  const secretAccessKey = 'S3RVER';
  return {
    endpoint,
    bucket,
    accessKeyId,
    secretAccessKey,
    env: {
      BLOB_STORE: 's3',
      S3_ENDPOINT: endpoint,
      S3_BUCKET: bucket,
      S3_REGION: 'us-east-1',
      S3_ACCESS_KEY_ID: accessKeyId,
      S3_SECRET_ACCESS_KEY: secretAccessKey,
      S3_FORCE_PATH_STYLE: 'true',
    },
    async close() {
      await server.close();
      fs.rmSync(directory, { recursive: true, force: true });
    },
  };
}
