import type { Db } from '../client';
import type { InsertableNotificationRow, NotificationRow } from './notification.table';

export async function insertNotifications(db: Db, rows: InsertableNotificationRow[]): Promise<void> {
  if (rows.length) await db.insertInto('notifications').values(rows).execute();
}

export async function listNotifications(db: Db, shopId: string, userId: string, limit = 50): Promise<NotificationRow[]> {
  return db
    .selectFrom('notifications')
    .selectAll()
    .where('shop_id', '=', shopId)
    .where('user_id', '=', userId)
    .orderBy('created_at', 'desc')
    .limit(limit)
    .execute();
}

export async function countUnreadNotifications(db: Db, shopId: string, userId: string): Promise<number> {
  const row = await db
    .selectFrom('notifications')
    .select((eb) => eb.fn.countAll<number>().as('n'))
    .where('shop_id', '=', shopId)
    .where('user_id', '=', userId)
    .where('read_at', 'is', null)
    .executeTakeFirstOrThrow();
  return Number(row.n);
}

/** Marks the given notifications (or all when `ids` is omitted) of this user read. */
export async function markNotificationsRead(db: Db, shopId: string, userId: string, at: string, ids?: string[]): Promise<void> {
  let query = db.updateTable('notifications').set({ read_at: at }).where('shop_id', '=', shopId).where('user_id', '=', userId).where('read_at', 'is', null);
  if (ids) {
    if (ids.length === 0) return;
    query = query.where('id', 'in', ids);
  }
  await query.execute();
}
