import { describe, expect, it } from 'vitest';
import { isDomainError } from '@revloop/domain';
import { FILE_LINK_TTL_MS, fileLinkQuery, signFileLink, verifyFileLink } from './file-links';

const SECRET = 's'.repeat(40);
const now = new Date('2026-12-02T12:00:00Z');
const codeOf = (action: () => unknown) => {
  try {
    action();
  } catch (err) {
    if (isDomainError(err)) return err.code;
    throw err;
  }
  return 'accepted';
};
const claims = (exp: number) => ({ shopId: 'shop-1', fileId: 'file-1', exp });

describe('signed download links', () => {
  it('accepts the link it issues, for the link lifetime', () => {
    const query = new URLSearchParams(fileLinkQuery(SECRET, 'shop-1', 'file-1', now));
    const exp = Number(query.get('exp'));
    expect(exp * 1000 - now.getTime()).toBeLessThanOrEqual(FILE_LINK_TTL_MS);
    expect(() => verifyFileLink(SECRET, claims(exp), query.get('sig')!, now)).not.toThrow();
  });

  it('refuses a correctly signed link whose expiry lies beyond now + the link lifetime', () => {
    const far = Math.floor(Date.parse('2099-01-01T00:00:00Z') / 1000);
    expect(codeOf(() => verifyFileLink(SECRET, claims(far), signFileLink(SECRET, claims(far)), now))).toBe('forbidden');
    const justOver = Math.floor((now.getTime() + FILE_LINK_TTL_MS) / 1000) + 60;
    expect(codeOf(() => verifyFileLink(SECRET, claims(justOver), signFileLink(SECRET, claims(justOver)), now))).toBe('forbidden');
  });
});
