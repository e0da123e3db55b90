import { createHash } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { DiskBlobStore } from './blob-store';

describe('blob store', () => {
  it('stores by SHA-256, once per content, and leaves no temporary file', async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'revloop-blobs-'));
    const store = new DiskBlobStore(dir);
    const bytes = new TextEncoder().encode('abc');
    const first = await store.putBytes(bytes);
    // FIPS 180-2 Appendix B.1 [STD]: SHA-256("abc").
    expect(first.sha256).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    expect(first.sha256).toBe(createHash('sha256').update(bytes).digest('hex'));
    const second = await store.putBytes(bytes);
    expect(second).toEqual(first);
    expect((await store.read(first.sha256)).toString()).toBe('abc');
    expect(fs.readdirSync(store.tempDir)).toEqual([]);
  });

  it('refuses a path that is not a digest', () => {
    const store = new DiskBlobStore(fs.mkdtempSync(path.join(os.tmpdir(), 'revloop-blobs-')));
    expect(() => store.pathOf('../../etc/passwd')).toThrow();
  });
});
