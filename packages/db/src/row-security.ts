import { sql } from 'kysely';
import { dialectOf, type Db } from './client';
import { shopScope, shopScopes } from './shop-scope-store';

export { shopScope } from './shop-scope-store';

/**
 * Runs `work` as shop `shopId`'s work. On PostgreSQL every connection that work (and everything it awaits or starts)
 * takes from `db`'s pool carries `app.shop_id = shopId` (see shopScopedPool in client.ts), a transaction from its start,
 * and the row-level security policies (migration 018) then hide every other shop's rows and refuse writes into them,
 * even from a query that forgot its shop filter. The API runs each request of a signed-in shop member in it
 * (apps/api/src/http/shop-scope.ts). On SQLite, which has no row-level security, it runs `work` as it is: the shop
 * filter in each repository query is the guard there.
 */
export function inShopScope<T>(db: Db, shopId: string, work: () => T): T {
  if (dialectOf(db) === 'sqlite') return work();
  return shopScopes.run({ shopId }, work);
}

/**
 * Runs `work` for no one shop, inside a shop's work: a user's memberships across shops (the shop switcher, switching
 * shop), platform pages, sign-in, system work a request starts (queued jobs). Every caller says in a comment why it
 * reads or writes across shops. Outside any shop scope it simply runs `work`. It applies to the connections taken inside
 * it: a transaction begun in a shop scope keeps that shop to its end, so begin the transaction inside this instead.
 */
export function outsideShopScope<T>(db: Db, work: () => T): T {
  if (dialectOf(db) === 'sqlite' || shopScope() === null) return work();
  return shopScopes.run({ shopId: null }, work);
}

/** The shop the database connection of `db` is scoped to, or null (unscoped, or SQLite). For tests and checks. */
export async function currentShopScope(db: Db): Promise<string | null> {
  if (dialectOf(db) === 'sqlite') return null;
  const { rows } = await sql<{ shop: string | null }>`select current_setting('app.shop_id', true) as shop`.execute(db);
  return rows[0]?.shop || null;
}
