import type { Db } from '../client';
import type { InsertablePublicSignUpRow, PublicSignUpRow } from './public-sign-up.table';

export async function insertPublicSignUp(db: Db, row: InsertablePublicSignUpRow): Promise<void> {
  await db.insertInto('public_sign_ups').values(row).execute();
}

/**
 * Marks a live sign-up used and returns it; undefined when the token is unknown, used or expired. The update is the
 * claim, so a link opened twice at once opens one account.
 */
export async function consumePublicSignUp(db: Db, tokenHash: string, now: string): Promise<PublicSignUpRow | undefined> {
  return db
    .updateTable('public_sign_ups')
    .set({ used_at: now })
    .where('token_hash', '=', tokenHash)
    .where('used_at', 'is', null)
    .where('expires_at', '>', now)
    .returningAll()
    .executeTakeFirst();
}

export async function findPublicSignUp(db: Db, tokenHash: string): Promise<PublicSignUpRow | undefined> {
  return db.selectFrom('public_sign_ups').selectAll().where('token_hash', '=', tokenHash).executeTakeFirst();
}
