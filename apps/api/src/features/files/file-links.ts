import { createHmac, timingSafeEqual } from 'node:crypto';
import { DomainError } from '@revloop/domain';

/** E-mailed download links live this long; a link claiming a later expiry is refused. */
export const FILE_LINK_TTL_MS = 7 * 86_400_000;

export interface FileLinkClaims {
  shopId: string;
  fileId: string;
  /** Expiry, whole seconds since the epoch. */
  exp: number;
}

const signatureOf = (secret: string, { shopId, fileId, exp }: FileLinkClaims): Buffer =>
  createHmac('sha256', secret).update(`file-download:v1:${shopId}:${fileId}:${exp}`).digest();

export function signFileLink(secret: string, claims: FileLinkClaims): string {
  return signatureOf(secret, claims).toString('base64url');
}

/** The query string of a download link for `fileId` that works without a session until `now + 7 days`. */
export function fileLinkQuery(secret: string, shopId: string, fileId: string, now: Date): string {
  const exp = Math.floor((now.getTime() + FILE_LINK_TTL_MS) / 1000);
  const sig = signFileLink(secret, { shopId, fileId, exp });
  return new URLSearchParams({ shop: shopId, exp: String(exp), sig }).toString();
}

/** Checks a link's signature in constant time, then its expiry; the claims are only trusted after both. */
export function verifyFileLink(secret: string, claims: FileLinkClaims, sig: string, now: Date): void {
  const expected = signatureOf(secret, claims);
  const given = Buffer.from(sig, 'base64url');
  if (given.length !== expected.length || !timingSafeEqual(given, expected)) {
    throw new DomainError('forbidden', 'This download link is not valid. Sign in to download the file.');
  }
  // A leaked secret must not mint links for ever: nothing we issue runs past now + the lifetime.
  if (claims.exp * 1000 > now.getTime() + FILE_LINK_TTL_MS) {
    throw new DomainError('forbidden', 'This download link is not valid: its expiry lies beyond the 7-day link lifetime. Sign in to download the file.');
  }
  if (claims.exp * 1000 <= now.getTime()) {
    throw new DomainError('forbidden', 'This download link has expired (links last 7 days). Sign in to download the file.');
  }
}
