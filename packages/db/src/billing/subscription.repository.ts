import type { Db } from '../client';
import type {
  InsertableShopSubscriptionRow,
  InsertableSubscriptionInvoiceRow,
  ShopSubscriptionRow,
  SubscriptionChangeRow,
  SubscriptionInvoiceRow,
  UpdateableShopSubscriptionRow,
} from './billing.table';

export async function findShopSubscription(db: Db, shopId: string): Promise<ShopSubscriptionRow | undefined> {
  return db.selectFrom('shop_subscriptions').selectAll().where('shop_id', '=', shopId).executeTakeFirst();
}

/** Webhooks name the provider's ids only: this maps them back to the shop (platform-level, no session). */
export async function findShopSubscriptionByProvider(
  db: Db,
  ids: { customerId?: string | null; subscriptionId?: string | null },
): Promise<ShopSubscriptionRow | undefined> {
  if (ids.subscriptionId) {
    const bySubscription = await db.selectFrom('shop_subscriptions').selectAll().where('stripe_subscription_id', '=', ids.subscriptionId).executeTakeFirst();
    if (bySubscription) return bySubscription;
  }
  if (!ids.customerId) return undefined;
  return db.selectFrom('shop_subscriptions').selectAll().where('stripe_customer_id', '=', ids.customerId).executeTakeFirst();
}

/** Creates the shop's row once; a second caller gets the row the first one wrote. */
export async function insertShopSubscription(db: Db, row: InsertableShopSubscriptionRow): Promise<ShopSubscriptionRow> {
  const inserted = await db.insertInto('shop_subscriptions').values(row).onConflict((oc) => oc.column('shop_id').doNothing()).returningAll().executeTakeFirst();
  return inserted ?? (await findShopSubscription(db, row.shop_id))!;
}

export async function updateShopSubscription(db: Db, shopId: string, patch: UpdateableShopSubscriptionRow): Promise<ShopSubscriptionRow | undefined> {
  return db.updateTable('shop_subscriptions').set(patch).where('shop_id', '=', shopId).returningAll().executeTakeFirst();
}

/** Shops created without a subscription row yet (sign-up and admin-created shops start their trial from here). */
export async function listShopsWithoutSubscription(db: Db): Promise<Array<{ id: string; created_at: string }>> {
  return db
    .selectFrom('shops')
    .leftJoin('shop_subscriptions', 'shop_subscriptions.shop_id', 'shops.id')
    .select(['shops.id', 'shops.created_at'])
    .where('shop_subscriptions.shop_id', 'is', null)
    .execute();
}

export async function listShopSubscriptions(db: Db): Promise<ShopSubscriptionRow[]> {
  return db.selectFrom('shop_subscriptions').selectAll().execute();
}

export interface PlatformSubscriptionRow extends ShopSubscriptionRow {
  shop_name: string;
  shop_status: string;
}

export async function listSubscriptionsForPlatform(db: Db): Promise<PlatformSubscriptionRow[]> {
  return db
    .selectFrom('shop_subscriptions')
    .innerJoin('shops', 'shops.id', 'shop_subscriptions.shop_id')
    .selectAll('shop_subscriptions')
    .select(['shops.name as shop_name', 'shops.status as shop_status'])
    .orderBy('shops.name')
    .execute();
}

export async function insertSubscriptionChange(db: Db, row: SubscriptionChangeRow): Promise<void> {
  await db.insertInto('subscription_changes').values(row).execute();
}

export async function listSubscriptionChanges(db: Db): Promise<SubscriptionChangeRow[]> {
  return db.selectFrom('subscription_changes').selectAll().orderBy('at').execute();
}

/** Keeps the provider's latest view of an invoice; a stale copy never replaces a paid one. */
export async function upsertSubscriptionInvoice(db: Db, row: InsertableSubscriptionInvoiceRow): Promise<void> {
  await db
    .insertInto('subscription_invoices')
    .values(row)
    .onConflict((oc) =>
      oc
        .column('id')
        .doUpdateSet((eb) => ({
          status: eb.ref('excluded.status'),
          amount_due_minor: eb.ref('excluded.amount_due_minor'),
          amount_paid_minor: eb.ref('excluded.amount_paid_minor'),
          updated_at: eb.ref('excluded.updated_at'),
        }))
        .where('subscription_invoices.status', '!=', 'paid'),
    )
    .execute();
}

export async function listSubscriptionInvoices(db: Db, shopId: string): Promise<SubscriptionInvoiceRow[]> {
  return db.selectFrom('subscription_invoices').selectAll().where('shop_id', '=', shopId).orderBy('created_at', 'desc').limit(24).execute();
}

/** Owners and tuners who are active: the seats a plan must cover. */
export async function countSeatsInUse(db: Db, shopId: string): Promise<number> {
  const row = await db
    .selectFrom('memberships')
    .select((eb) => eb.fn.countAll<number>().as('n'))
    .where('shop_id', '=', shopId)
    .where('status', '=', 'active')
    .where('role', 'in', ['owner', 'tuner'])
    .executeTakeFirstOrThrow();
  return Number(row.n);
}

export async function countJobsOpenedSince(db: Db, shopId: string, sinceIso: string): Promise<number> {
  const row = await db
    .selectFrom('jobs')
    .select((eb) => eb.fn.countAll<number>().as('n'))
    .where('shop_id', '=', shopId)
    .where('created_at', '>=', sinceIso)
    .executeTakeFirstOrThrow();
  return Number(row.n);
}
