import { createHash, randomUUID } from 'node:crypto';
import fs from 'node:fs';
import fsp from 'node:fs/promises';
import path from 'node:path';

export interface StoredBlob {
  sha256: string;
  size: number;
}

/**
 * Files live on local disk by content hash (SHA-256); the database keeps metadata only.
 * A blob is written to a temporary file, fsynced, then renamed into place, so a crash never leaves half a
 * file under a hash name; the same content uploaded twice is stored once.
 */
export class BlobStore {
  readonly root: string;
  readonly tempDir: string;

  constructor(dataDir: string) {
    this.root = path.join(dataDir, 'files');
    this.tempDir = path.join(dataDir, 'tmp');
    fs.mkdirSync(this.root, { recursive: true });
    fs.mkdirSync(this.tempDir, { recursive: true });
  }

  pathOf(sha256: string): string {
    if (!/^[0-9a-f]{64}$/.test(sha256)) throw new Error('Not a SHA-256 hex digest.');
    return path.join(this.root, sha256.slice(0, 2), sha256.slice(2, 4), sha256);
  }

  /** A fresh temporary path inside the data folder (same file system, so rename is atomic). */
  tempPath(): string {
    return path.join(this.tempDir, `${randomUUID()}.part`);
  }

  async hashFile(file: string): Promise<StoredBlob> {
    const hash = createHash('sha256');
    let size = 0;
    for await (const chunk of fs.createReadStream(file) as AsyncIterable<Buffer>) {
      hash.update(chunk);
      size += chunk.length;
    }
    return { sha256: hash.digest('hex'), size };
  }

  /** Moves a finished temporary file into the store under its hash and returns the hash and size. */
  async adopt(tempFile: string): Promise<StoredBlob> {
    const blob = await this.hashFile(tempFile);
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
    const handle = await fsp.open(temp, 'wx');
    try {
      await handle.writeFile(bytes);
    } finally {
      await handle.close();
    }
    return this.adopt(temp);
  }

  read(sha256: string): Promise<Buffer> {
    return fsp.readFile(this.pathOf(sha256));
  }

  stream(sha256: string): fs.ReadStream {
    return fs.createReadStream(this.pathOf(sha256));
  }

  async discard(tempFile: string | undefined): Promise<void> {
    if (tempFile) await fsp.rm(tempFile, { force: true });
  }

  /** Removes everything in the temp folder: only safe while no upload is in flight (at start-up). */
  async clearTemp(): Promise<{ files: number; bytes: number }> {
    let files = 0;
    let bytes = 0;
    for (const entry of await fsp.readdir(this.tempDir, { withFileTypes: true })) {
      const file = path.join(this.tempDir, entry.name);
      bytes += (await fsp.stat(file)).size;
      await fsp.rm(file, { recursive: true, force: true });
      files += 1;
    }
    return { files, bytes };
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

async function syncDir(dir: string): Promise<void> {
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
