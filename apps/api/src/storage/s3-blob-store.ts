import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import fsp from 'node:fs/promises';
import path from 'node:path';
import type { Readable } from 'node:stream';
import {
  DeleteObjectCommand,
  GetObjectCommand,
  HeadObjectCommand,
  ListObjectsV2Command,
  PutObjectCommand,
  S3Client,
  type S3ClientConfig,
} from '@aws-sdk/client-s3';
import { assertSha256, clearFolder, hashFile, writeTemp, type BlobStore, type StoredBlob } from './blob-store';

export interface S3BlobStoreOptions {
  bucket: string;
  region: string;
  /** An S3-compatible server's address; unset means AWS itself. */
  endpoint?: string | undefined;
  accessKeyId?: string | undefined;
  secretAccessKey?: string | undefined;
  /** Bucket in the path (http://host/bucket/key), which most self-hosted S3-compatible servers need. */
  forcePathStyle?: boolean | undefined;
  /** Key prefix inside the bucket. */
  prefix?: string;
}

const notFound = (error: unknown): boolean => {
  const e = error as { name?: string; $metadata?: { httpStatusCode?: number } };
  return e.name === 'NotFound' || e.name === 'NoSuchKey' || e.$metadata?.httpStatusCode === 404;
};

/**
 * Blobs in an S3-compatible bucket through the official AWS SDK, under `<prefix>ab/cd/<sha256>`. Uploads are still
 * spooled to a local temp file so the hash is known before anything is stored: the object is put under its hash in
 * one PUT, which S3 makes visible only when complete, so no reader ever sees half a blob, and the row is written
 * after. Readers that need a file (the analysis thread) get a local copy in DATA_DIR/blob-cache, which is always
 * valid because a hash names one content.
 */
export class S3BlobStore implements BlobStore {
  readonly tempDir: string;
  readonly cacheDir: string;
  readonly client: S3Client;
  private readonly bucket: string;
  private readonly prefix: string;

  constructor(dataDir: string, options: S3BlobStoreOptions) {
    this.tempDir = path.join(dataDir, 'tmp');
    this.cacheDir = path.join(dataDir, 'blob-cache');
    fs.mkdirSync(this.tempDir, { recursive: true });
    fs.mkdirSync(this.cacheDir, { recursive: true });
    this.bucket = options.bucket;
    this.prefix = options.prefix ?? 'files/';
    const config: S3ClientConfig = {
      region: options.region,
      forcePathStyle: options.forcePathStyle ?? false,
      // Checksums only where the API requires them: S3-compatible servers differ in the newer trailing checksums.
      requestChecksumCalculation: 'WHEN_REQUIRED',
      responseChecksumValidation: 'WHEN_REQUIRED',
      ...(options.endpoint && { endpoint: options.endpoint }),
      ...(options.accessKeyId && options.secretAccessKey && { credentials: { accessKeyId: options.accessKeyId, secretAccessKey: options.secretAccessKey } }),
    };
    this.client = new S3Client(config);
  }

  keyOf(sha256: string): string {
    assertSha256(sha256);
    return `${this.prefix}${sha256.slice(0, 2)}/${sha256.slice(2, 4)}/${sha256}`;
  }

  tempPath(): string {
    return path.join(this.tempDir, `${randomUUID()}.part`);
  }

  async exists(sha256: string): Promise<boolean> {
    try {
      await this.client.send(new HeadObjectCommand({ Bucket: this.bucket, Key: this.keyOf(sha256) }));
      return true;
    } catch (error) {
      if (notFound(error)) return false;
      throw error;
    }
  }

  async adopt(tempFile: string): Promise<StoredBlob> {
    const blob = await hashFile(tempFile);
    try {
      if (!(await this.exists(blob.sha256))) {
        await this.client.send(
          new PutObjectCommand({
            Bucket: this.bucket,
            Key: this.keyOf(blob.sha256),
            Body: fs.createReadStream(tempFile),
            ContentLength: blob.size,
            ContentType: 'application/octet-stream',
          }),
        );
      }
    } finally {
      await fsp.rm(tempFile, { force: true });
    }
    return blob;
  }

  async putBytes(bytes: Uint8Array): Promise<StoredBlob> {
    const temp = this.tempPath();
    await writeTemp(temp, bytes);
    return this.adopt(temp);
  }

  async stream(sha256: string): Promise<Readable> {
    const out = await this.client.send(new GetObjectCommand({ Bucket: this.bucket, Key: this.keyOf(sha256) }));
    return out.Body as Readable;
  }

  async read(sha256: string): Promise<Buffer> {
    const chunks: Buffer[] = [];
    for await (const chunk of await this.stream(sha256)) chunks.push(Buffer.from(chunk as Uint8Array));
    return Buffer.concat(chunks);
  }

  async localPath(sha256: string): Promise<string> {
    const file = path.join(this.cacheDir, this.keyOf(sha256).slice(this.prefix.length).replaceAll('/', '-'));
    if (fs.existsSync(file)) return file;
    const temp = this.tempPath();
    const handle = await fsp.open(temp, 'wx');
    try {
      for await (const chunk of await this.stream(sha256)) await handle.write(chunk as Uint8Array);
      await handle.sync();
    } catch (error) {
      await handle.close();
      await fsp.rm(temp, { force: true });
      throw error;
    }
    await handle.close();
    await fsp.rename(temp, file);
    return file;
  }

  async discard(tempFile: string | undefined): Promise<void> {
    if (tempFile) await fsp.rm(tempFile, { force: true });
  }

  clearTemp(): Promise<{ files: number; bytes: number }> {
    return clearFolder(this.tempDir);
  }

  async *list(): AsyncIterable<{ sha256: string; size: number; mtimeMs: number }> {
    let token: string | undefined;
    do {
      const page = await this.client.send(new ListObjectsV2Command({ Bucket: this.bucket, Prefix: this.prefix, ContinuationToken: token }));
      for (const item of page.Contents ?? []) {
        const name = item.Key?.split('/').pop() ?? '';
        if (!/^[0-9a-f]{64}$/.test(name)) continue;
        yield { sha256: name, size: item.Size ?? 0, mtimeMs: item.LastModified?.getTime() ?? 0 };
      }
      token = page.IsTruncated ? page.NextContinuationToken : undefined;
    } while (token);
  }

  async remove(sha256: string): Promise<void> {
    await this.client.send(new DeleteObjectCommand({ Bucket: this.bucket, Key: this.keyOf(sha256) }));
    await fsp.rm(path.join(this.cacheDir, this.keyOf(sha256).slice(this.prefix.length).replaceAll('/', '-')), { force: true });
  }
}
