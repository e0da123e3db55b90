import type { Db } from '../client';
import type { SessionRow } from './session.table';

export async function insertSession(db: Db, row: SessionRow): Promise<void> {
  await db.insertInto('sessions').values(row).execute();
}

export async function findSession(db: Db, id: string): Promise<SessionRow | undefined> {
  return db.selectFrom('sessions').selectAll().where('id', '=', id).executeTakeFirst();
}

export async function extendSession(db: Db, id: string, expiresAt: number): Promise<void> {
  await db.updateTable('sessions').set({ expires_at: expiresAt }).where('id', '=', id).execute();
}

export async function deleteSession(db: Db, id: string): Promise<void> {
  await db.deleteFrom('sessions').where('id', '=', id).execute();
}

export async function deleteUserSessions(db: Db, userId: string, shopId?: string): Promise<void> {
  let query = db.deleteFrom('sessions').where('user_id', '=', userId);
  if (shopId) query = query.where('shop_id', '=', shopId);
  await query.execute();
}

export async function deleteExpiredSessions(db: Db, now: number): Promise<void> {
  await db.deleteFrom('sessions').where((eb) => eb.or([eb('expires_at', '<=', now), eb('absolute_expires_at', '<=', now)])).execute();
}
