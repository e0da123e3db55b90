import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { loadEnv } from '../../env';
import { hashPassword, usePasswordHashCost, verifyPassword } from './password';

const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'revloop-password-'));
afterAll(() => {
  fs.rmSync(dataDir, { recursive: true, force: true });
  usePasswordHashCost({ TEST_ONLY_HASH_COST: 'low' });
});

describe('the test-only password hash cost', () => {
  it('is refused outside NODE_ENV=test', () => {
    for (const NODE_ENV of ['development', 'production'] as const) {
      expect(() => loadEnv({ NODE_ENV, DATA_DIR: dataDir, FILE_LINK_SECRET: 'k'.repeat(32), TEST_ONLY_HASH_COST: 'low' })).toThrow(/TEST_ONLY_HASH_COST is for tests only/);
    }
    expect(loadEnv({ NODE_ENV: 'test', DATA_DIR: dataDir, TEST_ONLY_HASH_COST: 'low' }).TEST_ONLY_HASH_COST).toBe('low');
  });

  it('hashes at the OWASP minimum unless asked, and either hash verifies', async () => {
    // argon2id m=19456 KiB, t=2, p=1: the OWASP Password Storage Cheat Sheet's Argon2id minimum (docs/decisions/001).
    usePasswordHashCost({ TEST_ONLY_HASH_COST: undefined });
    const strong = await hashPassword('a-long-enough-password');
    expect(strong).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/);
    usePasswordHashCost({ TEST_ONLY_HASH_COST: 'low' });
    const cheap = await hashPassword('a-long-enough-password');
    expect(cheap).toMatch(/^\$argon2id\$v=19\$m=1024,t=1,p=1\$/);
    expect(await verifyPassword(strong, 'a-long-enough-password')).toBe(true);
    expect(await verifyPassword(cheap, 'a-long-enough-password')).toBe(true);
    expect(await verifyPassword(cheap, 'another-password')).toBe(false);
  });
});
