import type { Db } from '../client';
import type { InsertableShopRow, ShopRow, ShopStatus, UpdateableShopRow } from './shop.table';

export async function insertShop(db: Db, row: InsertableShopRow): Promise<ShopRow> {
  return db.insertInto('shops').values(row).returningAll().executeTakeFirstOrThrow();
}

/** A shop is the tenant itself, so looking one up by id is the platform's (or the session's own shop) business. */
export async function findShopById(db: Db, id: string): Promise<ShopRow | undefined> {
  return db.selectFrom('shops').selectAll().where('id', '=', id).executeTakeFirst();
}

export interface ShopOverview extends ShopRow {
  owner_name: string | null;
  owner_email: string | null;
  member_count: number;
}

export async function listShopsForPlatform(db: Db): Promise<ShopOverview[]> {
  return db
    .selectFrom('shops')
    .selectAll('shops')
    .select((eb) => [
      eb
        .selectFrom('memberships')
        .innerJoin('users', 'users.id', 'memberships.user_id')
        .select('users.name')
        .whereRef('memberships.shop_id', '=', 'shops.id')
        .where('memberships.role', '=', 'owner')
        .orderBy('memberships.created_at')
        .limit(1)
        .as('owner_name'),
      eb
        .selectFrom('memberships')
        .innerJoin('users', 'users.id', 'memberships.user_id')
        .select('users.email')
        .whereRef('memberships.shop_id', '=', 'shops.id')
        .where('memberships.role', '=', 'owner')
        .orderBy('memberships.created_at')
        .limit(1)
        .as('owner_email'),
      eb
        .selectFrom('memberships')
        .select((e) => e.fn.countAll<number>().as('n'))
        .whereRef('memberships.shop_id', '=', 'shops.id')
        .where('memberships.status', '=', 'active')
        .as('member_count'),
    ])
    .orderBy('shops.created_at', 'desc')
    .execute() as Promise<ShopOverview[]>;
}

export async function setShopStatus(db: Db, id: string, status: ShopStatus, at: string): Promise<ShopRow | undefined> {
  return db
    .updateTable('shops')
    .set({ status, suspended_at: status === 'suspended' ? at : null })
    .where('id', '=', id)
    .returningAll()
    .executeTakeFirst();
}

export async function updateShop(db: Db, id: string, patch: UpdateableShopRow): Promise<ShopRow | undefined> {
  return db.updateTable('shops').set(patch).where('id', '=', id).returningAll().executeTakeFirst();
}
