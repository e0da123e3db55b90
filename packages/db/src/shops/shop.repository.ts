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

/** The shop behind a public page; undefined when the slug is unknown or the page is off (both answer 404). */
export async function findPublicShopBySlug(db: Db, slug: string): Promise<ShopRow | undefined> {
  return db.selectFrom('shops').selectAll().where('slug', '=', slug).where('public_page', '=', 1).where('status', '=', 'active').executeTakeFirst();
}

/** True when another shop already uses the slug. */
export async function isSlugTaken(db: Db, slug: string, exceptShopId: string): Promise<boolean> {
  const row = await db.selectFrom('shops').select('id').where('slug', '=', slug).where('id', '!=', exceptShopId).executeTakeFirst();
  return row !== undefined;
}

export interface ShopSetupFacts {
  activePackages: number;
  /** Tuners in the shop plus tuner invitations still open. */
  tunersInvited: number;
  subscriptionStatus: string | null;
}

/** What the first-run checklist is derived from, in one query. */
export async function shopSetupFacts(db: Db, shopId: string, now: string): Promise<ShopSetupFacts> {
  const row = await db
    .selectNoFrom((eb) => [
      eb.selectFrom('packages').select((e) => e.fn.countAll<number>().as('n')).where('shop_id', '=', shopId).where('active', '=', 1).as('active_packages'),
      eb
        .selectFrom('memberships')
        .select((e) => e.fn.countAll<number>().as('n'))
        .where('shop_id', '=', shopId)
        .where('role', '=', 'tuner')
        .as('tuners'),
      eb
        .selectFrom('invitations')
        .select((e) => e.fn.countAll<number>().as('n'))
        .where('shop_id', '=', shopId)
        .where('role', '=', 'tuner')
        .where('accepted_at', 'is', null)
        .where('revoked_at', 'is', null)
        .where('expires_at', '>', now)
        .as('tuner_invitations'),
      eb.selectFrom('shop_subscriptions').select('status').where('shop_id', '=', shopId).as('subscription_status'),
    ])
    .executeTakeFirstOrThrow();
  return {
    activePackages: Number(row.active_packages ?? 0),
    tunersInvited: Number(row.tuners ?? 0) + Number(row.tuner_invitations ?? 0),
    subscriptionStatus: row.subscription_status ?? null,
  };
}
