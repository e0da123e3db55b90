import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { HeadObjectCommand } from '@aws-sdk/client-s3';
import { startLocalS3, type LocalS3 } from '../testing/s3-server';
import { S3BlobStore } from './s3-blob-store';

// The official AWS SDK against s3rver started here (random port, temp folder): the same calls reach AWS S3 or any
// S3-compatible server in production.
let s3: LocalS3;
let store: S3BlobStore;
let dataDir: string;

beforeAll(async () => {
  s3 = await startLocalS3();
  dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'revloop-s3-data-'));
  store = new S3BlobStore(dataDir, {
    bucket: s3.bucket,
    region: 'us-east-1',
    endpoint: s3.endpoint,
    accessKeyId: s3.accessKeyId,
    secretAccessKey: s3.secretAccessKey,
    forcePathStyle: true,
  });
});

afterAll(async () => {
  store.client.destroy();
  await s3.close();
  fs.rmSync(dataDir, { recursive: true, force: true });
});

describe('S3 blob store', () => {
  it('stores by SHA-256, once per content, and leaves no temporary file', async () => {
    const first = await store.putBytes(new TextEncoder().encode('abc'));
    // FIPS 180-2 Appendix B.1 [STD]: SHA-256("abc").
    expect(first).toEqual({ sha256: 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad', size: 3 });
    expect(await store.putBytes(new TextEncoder().encode('abc'))).toEqual(first);
    expect((await store.read(first.sha256)).toString()).toBe('abc');
    expect(fs.readdirSync(store.tempDir)).toEqual([]);
    const head = await store.client.send(new HeadObjectCommand({ Bucket: s3.bucket, Key: store.keyOf(first.sha256) }));
    expect(head.ContentLength).toBe(3);
  });

  it('adopts an uploaded temp file, streams it back, and gives a local copy for file readers', async () => {
    const bytes = Buffer.alloc(3 * 1024 * 1024, 7);
    const temp = store.tempPath();
    fs.writeFileSync(temp, bytes);
    const blob = await store.adopt(temp);
    expect(fs.existsSync(temp)).toBe(false);
    expect(blob.size).toBe(bytes.length);
    const chunks: Buffer[] = [];
    for await (const chunk of await store.stream(blob.sha256)) chunks.push(chunk as Buffer);
    expect(Buffer.concat(chunks).equals(bytes)).toBe(true);
    const local = await store.localPath(blob.sha256);
    expect(fs.readFileSync(local).equals(bytes)).toBe(true);
    expect(await store.localPath(blob.sha256)).toBe(local);
  });

  it('lists, removes, and answers a missing blob as missing', async () => {
    const blob = await store.putBytes(Buffer.from('to be removed'));
    const listed: string[] = [];
    for await (const item of store.list()) listed.push(item.sha256);
    expect(listed).toContain(blob.sha256);
    await store.remove(blob.sha256);
    expect(await store.exists(blob.sha256)).toBe(false);
    await expect(store.read(blob.sha256)).rejects.toThrow();
    expect(() => store.keyOf('../x')).toThrow();
  });
});
