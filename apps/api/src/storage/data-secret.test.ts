import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { loadEnv } from '../env';
import { dataFolderSecret } from './data-secret';

const dirs: string[] = [];
const tempDir = () => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'revloop-secret-'));
  dirs.push(dir);
  return dir;
};
afterEach(() => {
  for (const dir of dirs.splice(0)) fs.rmSync(dir, { recursive: true, force: true });
});

describe('a data folder without a configured link secret', () => {
  it('gets a random secret made once, kept in the folder with mode 0600', () => {
    const dir = tempDir();
    const first = dataFolderSecret(dir, 'file-link');
    const file = path.join(dir, 'secrets', 'file-link.key');
    expect(fs.statSync(file).mode & 0o777).toBe(0o600);
    // 32 random bytes as base64url are 43 characters (RFC 4648 §5) [STD].
    expect(first).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(dataFolderSecret(dir, 'file-link')).toBe(first);
    expect(dataFolderSecret(tempDir(), 'file-link')).not.toBe(first);
    expect(fs.readdirSync(path.join(dir, 'secrets'))).toEqual(['file-link.key']);
  });

  it('is what loadEnv signs links with, never a constant; a configured secret wins', () => {
    const dir = tempDir();
    const env = loadEnv({ NODE_ENV: 'development', DATA_DIR: dir });
    expect(env.FILE_LINK_SECRET).toBe(fs.readFileSync(path.join(dir, 'secrets', 'file-link.key'), 'utf8').trim());
    expect(env.FILE_LINK_SECRET).not.toBe('revloop-development-file-link-secret-not-for-production');
    expect(loadEnv({ NODE_ENV: 'development', DATA_DIR: tempDir() }).FILE_LINK_SECRET).not.toBe(env.FILE_LINK_SECRET);
    const configured = 'c'.repeat(40);
    expect(loadEnv({ NODE_ENV: 'development', DATA_DIR: dir, FILE_LINK_SECRET: configured }).FILE_LINK_SECRET).toBe(configured);
  });

  it('refuses a kept secret that is too short instead of signing with it', () => {
    const dir = tempDir();
    fs.mkdirSync(path.join(dir, 'secrets'));
    fs.writeFileSync(path.join(dir, 'secrets', 'file-link.key'), 'short\n');
    expect(() => dataFolderSecret(dir, 'file-link')).toThrow(/shorter than 32/);
  });
});
