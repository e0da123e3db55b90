import { createHash, randomUUID } from 'node:crypto';
import fs from 'node:fs';
import fsp from 'node:fs/promises';
import path from 'node:path';
import type { Readable } from 'node:stream';

export interface StoredBlob {
  sha256: string;
  size: number;
}

/**
 * Content-addressed file storage: a blob is named by its SHA-256 and the database keeps metadata only. Uploads are
 * spooled to a local temporary file (`tempDir`, `tempPath`), hashed, and only then stored under the hash, so no
 * reader ever sees half a file under a hash name and the same content is stored once. The row is written after
 * `adopt` returns. DiskBlobStore keeps blobs under DATA_DIR/files; S3BlobStore in an S3-compatible bucket.
 */
export interface BlobStore {
  /** Local folder for half-received uploads (multer writes here). */
  readonly tempDir: string;
  /** A fresh temporary path inside `tempDir`. */
  tempPath(): string;
  /** Stores a finished temporary file under its hash (the temp file is gone afterwards) and returns hash and size. */
  adopt(tempFile: string): Promise<StoredBlob>;
  /** Stores bytes held in memory (seeds, generated files) the same careful way. */
  putBytes(bytes: Uint8Array): Promise<StoredBlob>;
  read(sha256: string): Promise<Buffer>;
  stream(sha256: string): Promise<Readable>;
  /** A local file with the blob's bytes, for readers that need a path (the analysis thread, the series cache). */
  localPath(sha256: string): Promise<string>;
  exists(sha256: string): Promise<boolean>;
  discard(tempFile: string | undefined): Promise<void>;
  /** Removes everything in the temp folder: only safe while no upload is in flight in this process (at start-up). */
  clearTemp(): Promise<{ files: number; bytes: number }>;
  /** Every stored blob with its size and modification time. */
  list(): AsyncIterable<{ sha256: string; size: number; mtimeMs: number }>;
  remove(sha256: string): Promise<void>;
}

export function assertSha256(sha256: string): void {
  if (!/^[0-9a-f]{64}$/.test(sha256)) throw new Error('Not a SHA-256 hex digest.');
}

export async function hashFile(file: string): Promise<StoredBlob> {
  const hash = createHash('sha256');
  let size = 0;
  for await (const chunk of fs.createReadStream(file) as AsyncIterable<Buffer>) {
    hash.update(chunk);
    size += chunk.length;
  }
  return { sha256: hash.digest('hex'), size };
}

/** Writes bytes to a new temporary file and fsyncs it. */
export async function writeTemp(file: string, bytes: Uint8Array): Promise<void> {
  const handle = await fsp.open(file, 'wx');
  try {
    await handle.writeFile(bytes);
    await handle.sync();
  } finally {
    await handle.close();
  }
}

export async function clearFolder(dir: string): Promise<{ files: number; bytes: number }> {
  let files = 0;
  let bytes = 0;
  for (const entry of await fsp.readdir(dir, { withFileTypes: true })) {
    const file = path.join(dir, entry.name);
    bytes += (await fsp.stat(file)).size;
    await fsp.rm(file, { recursive: true, force: true });
    files += 1;
  }
  return { files, bytes };
}

/**
 * Blobs on local disk under DATA_DIR/files/ab/cd/<sha256>. A blob is written to a temporary file, fsynced, then
 * renamed into place, so a crash never leaves half a file under a hash name.
 */
export class DiskBlobStore implements BlobStore {
  readonly root: string;
  readonly tempDir: string;

  constructor(dataDir: string) {
    this.root = path.join(dataDir, 'files');
    this.tempDir = path.join(dataDir, 'tmp');
    fs.mkdirSync(this.root, { recursive: true });
    fs.mkdirSync(this.tempDir, { recursive: true });
  }

  pathOf(sha256: string): string {
    assertSha256(sha256);
    return path.join(this.root, sha256.slice(0, 2), sha256.slice(2, 4), sha256);
  }

  /** A fresh temporary path inside the data folder (same file system, so rename is atomic). */
  tempPath(): string {
    return path.join(this.tempDir, `${randomUUID()}.part`);
  }

  /** Moves a finished temporary file into the store under its hash and returns the hash and size. */
  async adopt(tempFile: string): Promise<StoredBlob> {
    const blob = await hashFile(tempFile);
    const target = this.pathOf(blob.sha256);
    if (fs.existsSync(target)) {
      await fsp.rm(tempFile, { force: true });
      return blob;
    }
    const handle = await fsp.open(tempFile, 'r+');
    try {
      await handle.sync();
    } finally {
      await handle.close();
    }
    await fsp.mkdir(path.dirname(target), { recursive: true });
    await fsp.rename(tempFile, target);
    await syncDir(path.dirname(target));
    return blob;
  }

  /** Stores bytes held in memory (seeds, generated files) the same careful way. */
  async putBytes(bytes: Uint8Array): Promise<StoredBlob> {
    const temp = this.tempPath();
    await writeTemp(temp, bytes);
    return this.adopt(temp);
  }

  read(sha256: string): Promise<Buffer> {
    return fsp.readFile(this.pathOf(sha256));
  }

  stream(sha256: string): Promise<Readable> {
    const file = this.pathOf(sha256);
    // Opened before resolving, so a missing blob rejects here instead of erroring mid-response.
    return fsp.access(file).then(() => fs.createReadStream(file));
  }

  localPath(sha256: string): Promise<string> {
    return Promise.resolve(this.pathOf(sha256));
  }

  exists(sha256: string): Promise<boolean> {
    return fsp.access(this.pathOf(sha256)).then(
      () => true,
      () => false,
    );
  }

  async discard(tempFile: string | undefined): Promise<void> {
    if (tempFile) await fsp.rm(tempFile, { force: true });
  }

  /** Removes everything in the temp folder: only safe while no upload is in flight (at start-up). */
  clearTemp(): Promise<{ files: number; bytes: number }> {
    return clearFolder(this.tempDir);
  }

  /** Every stored blob with its size and modification time, walking the ab/cd/<sha256> layout. */
  async *list(): AsyncIterable<{ sha256: string; size: number; mtimeMs: number }> {
    for (const a of await fsp.readdir(this.root)) {
      for (const b of await fsp.readdir(path.join(this.root, a)).catch(() => [])) {
        for (const name of await fsp.readdir(path.join(this.root, a, b)).catch(() => [])) {
          if (!/^[0-9a-f]{64}$/.test(name)) continue;
          const stat = await fsp.stat(path.join(this.root, a, b, name));
          yield { sha256: name, size: stat.size, mtimeMs: stat.mtimeMs };
        }
      }
    }
  }

  async remove(sha256: string): Promise<void> {
    await fsp.rm(this.pathOf(sha256), { force: true });
  }
}

export async function syncDir(dir: string): Promise<void> {
  // A directory fsync makes the rename itself durable; some file systems refuse it, which is harmless here.
  try {
    const handle = await fsp.open(dir, 'r');
    try {
      await handle.sync();
    } finally {
      await handle.close();
    }
  } catch {
    // not supported on this file system
  }
}
