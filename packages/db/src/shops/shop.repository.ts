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
    // The shop's first owner stands for it in the platform's list.
    .leftJoin('memberships as owner_membership', (join) =>
      join
        .onRef('owner_membership.shop_id', '=', 'shops.id')
        .on((eb) =>
          eb(
            'owner_membership.id',
            '=',
            eb
              .selectFrom('memberships')
              .select('memberships.id')
              .whereRef('memberships.shop_id', '=', 'shops.id')
              .where('memberships.role', '=', 'owner')
              .orderBy('memberships.created_at')
              .limit(1),
          ),
        ),
    )
    .leftJoin('users as owner', 'owner.id', 'owner_membership.user_id')
    .selectAll('shops')
    .select(['owner.name as owner_name', 'owner.email as owner_email'])
    .select((eb) =>
      eb
        .selectFrom('memberships')
        .select((e) => e.fn.countAll<number>().as('n'))
        .whereRef('memberships.shop_id', '=', 'shops.id')
        .where('memberships.status', '=', 'active')
        .as('member_count'),
    )
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
