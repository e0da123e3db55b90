import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

const readSecret = (file: string): string => {
  const secret = fs.readFileSync(file, 'utf8').trim();
  if (secret.length < 32) throw new Error(`${file} holds a secret shorter than 32 characters: delete it to have a new one made`);
  return secret;
};

/**
 * A secret kept in `DATA_DIR/secrets/<name>.key`: read when it is there, else 32 random bytes written once,
 * mode 0600, atomically (temp file, fsync, then a hard link that fails when another process won the race), so
 * every process on this data folder signs with the same key and no key is ever a constant in the source.
 */
export function dataFolderSecret(dataDir: string, name: string): string {
  const dir = path.join(dataDir, 'secrets');
  const file = path.join(dir, `${name}.key`);
  if (fs.existsSync(file)) return readSecret(file);
  fs.mkdirSync(dir, { recursive: true, mode: 0o700 });
  const temp = path.join(dir, `.${name}.${process.pid}.${randomBytes(6).toString('hex')}.tmp`);
  const fd = fs.openSync(temp, 'wx', 0o600);
  try {
    fs.writeFileSync(fd, `${randomBytes(32).toString('base64url')}\n`);
    fs.fsyncSync(fd);
  } finally {
    fs.closeSync(fd);
  }
  try {
    fs.linkSync(temp, file);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== 'EEXIST') throw err;
  } finally {
    fs.rmSync(temp, { force: true });
  }
  const dirFd = fs.openSync(dir, 'r');
  try {
    fs.fsyncSync(dirFd);
  } finally {
    fs.closeSync(dirFd);
  }
  return readSecret(file);
}
