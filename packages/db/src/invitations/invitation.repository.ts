import type { Db } from '../client';
import type { InsertableInvitationRow, InvitationRow } from './invitation.table';

export async function insertInvitation(db: Db, row: InsertableInvitationRow): Promise<InvitationRow> {
  return db.insertInto('invitations').values(row).returningAll().executeTakeFirstOrThrow();
}

export interface PendingInvitationRow extends InvitationRow {
  dealer_name: string | null;
}

export async function listPendingInvitations(db: Db, shopId: string, now: string): Promise<PendingInvitationRow[]> {
  return db
    .selectFrom('invitations')
    .leftJoin('dealers', 'dealers.id', 'invitations.dealer_id')
    .selectAll('invitations')
    .select('dealers.name as dealer_name')
    .where('invitations.shop_id', '=', shopId)
    .where('invitations.accepted_at', 'is', null)
    .where('invitations.revoked_at', 'is', null)
    .where('invitations.expires_at', '>', now)
    .orderBy('invitations.created_at', 'desc')
    .execute();
}

/** The token itself is the credential here, so this lookup is not shop-scoped. */
export async function findLiveInvitationByTokenHash(
  db: Db,
  tokenHash: string,
  now: string,
): Promise<InvitationRow | undefined> {
  return db
    .selectFrom('invitations')
    .selectAll()
    .where('token_hash', '=', tokenHash)
    .where('accepted_at', 'is', null)
    .where('revoked_at', 'is', null)
    .where('expires_at', '>', now)
    .executeTakeFirst();
}

export async function markInvitationAccepted(db: Db, id: string, at: string): Promise<boolean> {
  const result = await db
    .updateTable('invitations')
    .set({ accepted_at: at })
    .where('id', '=', id)
    .where('accepted_at', 'is', null)
    .executeTakeFirst();
  return Number(result.numUpdatedRows) === 1;
}

export async function revokeInvitation(db: Db, shopId: string, id: string, at: string): Promise<boolean> {
  const result = await db
    .updateTable('invitations')
    .set({ revoked_at: at })
    .where('shop_id', '=', shopId)
    .where('id', '=', id)
    .where('accepted_at', 'is', null)
    .where('revoked_at', 'is', null)
    .executeTakeFirst();
  return Number(result.numUpdatedRows) === 1;
}

export async function findInvitation(db: Db, shopId: string, id: string): Promise<InvitationRow | undefined> {
  return db.selectFrom('invitations').selectAll().where('shop_id', '=', shopId).where('id', '=', id).executeTakeFirst();
}

/** Live invitations that will take a tuner seat when accepted (owners and tuners). */
export async function countPendingSeatInvitations(db: Db, shopId: string, now: string): Promise<number> {
  const row = await db
    .selectFrom('invitations')
    .select((eb) => eb.fn.countAll<number>().as('n'))
    .where('shop_id', '=', shopId)
    .where('role', 'in', ['owner', 'tuner'])
    .where('accepted_at', 'is', null)
    .where('revoked_at', 'is', null)
    .where('expires_at', '>', now)
    .executeTakeFirstOrThrow();
  return Number(row.n);
}
