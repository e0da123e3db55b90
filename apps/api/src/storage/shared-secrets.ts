import { randomBytes } from 'node:crypto';
import { sharedSecret, type Db } from '@revloop/db';
import type { Env } from '../env';

/**
 * Secrets every API instance must sign and verify with, kept in the database (shared_secrets): the first instance
 * stores its candidate and the rest read it back. A FILE_LINK_SECRET given in the environment wins; otherwise this
 * data folder's key is offered, so a single-instance install keeps the links it already mailed.
 */
export async function loadSharedSecrets(db: Db, env: Env, at: Date): Promise<{ fileLink: string; signInDevice: string }> {
  const fileLink = env.FILE_LINK_SECRET_GIVEN ? env.FILE_LINK_SECRET : await sharedSecret(db, 'file-link', env.FILE_LINK_SECRET, at);
  const signInDevice = await sharedSecret(db, 'sign-in-device', randomBytes(32).toString('base64url'), at);
  return { fileLink, signInDevice };
}
