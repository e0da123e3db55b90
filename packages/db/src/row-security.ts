import { sql } from 'kysely';
import { dialectOf, type Db } from './client';
import { inTransaction } from './transaction';

/**
 * Runs `work` as shop `shopId`'s work. On PostgreSQL it runs in a transaction (the caller's when `db` is one) that
 * sets `app.shop_id` for that transaction only, and the row-level security policies (migration 014) then hide every
 * other shop's rows and refuse writes into them, even from a query that forgot its shop filter. On SQLite, which has
 * no row-level security, it runs `work` on `db` as it is: the shop filter in each repository query is the guard.
 */
export async function inShopTransaction<T>(db: Db, shopId: string, work: (trx: Db) => Promise<T>): Promise<T> {
  if (dialectOf(db) === 'sqlite') return work(db);
  return inTransaction(db, async (trx) => {
    const { rows } = await sql<{ previous: string | null }>`select current_setting('app.shop_id', true) as previous`.execute(trx);
    await sql`select set_config('app.shop_id', ${shopId}, true)`.execute(trx);
    try {
      return await work(trx);
    } finally {
      // A caller's transaction that named another shop (or none) gets it back for its remaining steps.
      if (db.isTransaction) await sql`select set_config('app.shop_id', ${rows[0]?.previous ?? ''}, true)`.execute(trx);
    }
  });
}

/** The shop the current PostgreSQL transaction is scoped to, or null (unscoped, or SQLite). For tests and checks. */
export async function currentShopScope(db: Db): Promise<string | null> {
  if (dialectOf(db) === 'sqlite') return null;
  const { rows } = await sql<{ shop: string | null }>`select current_setting('app.shop_id', true) as shop`.execute(db);
  return rows[0]?.shop || null;
}
