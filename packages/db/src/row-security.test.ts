import { sql } from 'kysely';
import { afterEach, describe, expect, it } from 'vitest';
import { createDb, type Db } from './client';
import { insertDealer } from './dealers/dealer.repository';
import { isUniqueViolation } from './errors';
import { newId, nowIso } from './ids';
import { currentShopScope, inShopScope, outsideShopScope, shopScope } from './row-security';
import { testDbUrl, testEngine } from './testing/postgres';
import { jobIn, twoShops } from './testing/two-shops';

async function dealerIn(db: Db, shopId: string, name: string) {
  return insertDealer(db, {
    id: newId(),
    shop_id: shopId,
    name,
    contact_name: name,
    contact_email: `${newId()}@example.test`,
    created_at: nowIso(),
  });
}

const small: Db[] = [];
afterEach(async () => {
  await Promise.all(small.splice(0).map((db) => db.destroy()));
});

/** Another handle on the same test database with a pool of `size` connections, so concurrent scopes share them. */
function smallPool(db: Db, size: number): Db {
  const other = createDb(testDbUrl(db), { poolSize: size });
  small.push(other);
  return other;
}

const pause = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

describe.skipIf(testEngine() !== 'postgres')('row-level security on PostgreSQL', () => {
  it('a query without the shop filter, inside a shop scope, sees and changes only that shop’s rows', async () => {
    const { db, shopA, shopB, ownerA, ownerB } = await twoShops();
    await dealerIn(db, shopA, 'Dealer of A');
    const ofB = await dealerIn(db, shopB, 'Dealer of B');
    await jobIn(db, shopA, ownerA, { goals: 'Job of A' });
    await jobIn(db, shopB, ownerB, { goals: 'Job of B' });

    await inShopScope(db, shopA, async () => {
      // Deliberately no `where shop_id = …`: the policy alone keeps shop B out.
      expect(await db.selectFrom('jobs').select(['goals', 'shop_id']).execute()).toEqual([{ goals: 'Job of A', shop_id: shopA }]);
      expect(await db.selectFrom('dealers').select(['name', 'shop_id']).execute()).toEqual([{ name: 'Dealer of A', shop_id: shopA }]);
      expect((await db.selectFrom('memberships').select('shop_id').execute()).map((m) => m.shop_id)).toEqual([shopA]);
      expect((await db.selectFrom('shops').select('id').execute()).map((s) => s.id)).toEqual([shopA]);
      // An unfiltered update or delete reaches no other shop's row either.
      const updated = await db.updateTable('jobs').set({ goals: 'Renamed' }).executeTakeFirst();
      expect(updated.numUpdatedRows).toBe(1n);
      await db.updateTable('dealers').set({ phone: '555-0100' }).execute();
      await db.deleteFrom('dealers').where('id', '=', ofB.id).execute();
      // Nor can shop A's work write a row into another shop.
      await expect(dealerIn(db, shopB, 'Smuggled')).rejects.toThrow(/row-level security/);
    });

    const goals = await db.selectFrom('jobs').select(['goals', 'shop_id']).orderBy('goals').execute();
    expect(goals).toEqual([{ goals: 'Job of B', shop_id: shopB }, { goals: 'Renamed', shop_id: shopA }]);
    const b = await db.selectFrom('dealers').selectAll().where('id', '=', ofB.id).executeTakeFirstOrThrow();
    expect(b.phone).toBeNull();
    expect(await db.selectFrom('dealers').select('name').where('name', '=', 'Smuggled').execute()).toEqual([]);
  });

  it('a transaction begun in a shop scope keeps it; unscoped work, and work marked outside the scope, see every shop', async () => {
    const { db, shopA, shopB } = await twoShops();
    const allShops = [shopA, shopB].sort();
    const shopIds = async (on: Db) => (await on.selectFrom('shops').select('id').execute()).map((s) => s.id).sort();

    expect(await shopIds(db)).toEqual(allShops);
    await inShopScope(db, shopA, async () => {
      expect(shopScope()).toBe(shopA);
      await db.transaction().execute(async (trx) => {
        expect(await currentShopScope(trx)).toBe(shopA);
        expect(await shopIds(trx)).toEqual([shopA]);
      });
      await outsideShopScope(db, async () => {
        expect(shopScope()).toBeNull();
        expect(await shopIds(db)).toEqual(allShops);
        await inShopScope(db, shopB, async () => expect(await shopIds(db)).toEqual([shopB]));
      });
      expect(await currentShopScope(db)).toBe(shopA);
    });
    // A connection that carried a shop is handed to unscoped work with the scope cleared.
    expect(await currentShopScope(db)).toBeNull();
    expect(await shopIds(db)).toEqual(allShops);
  });

  it('concurrent scopes sharing one or two connections never see each other’s rows', async () => {
    const { db, shopA, shopB } = await twoShops();
    await dealerIn(db, shopA, 'Dealer of A');
    await dealerIn(db, shopB, 'Dealer of B');
    for (const size of [1, 2]) {
      const pool = smallPool(db, size);
      const seen: Array<{ wanted: string | null; got: string[] }> = [];
      const worker = async (wanted: string | null, i: number) => {
        for (let step = 0; step < 4; step++) {
          const names = async () => (await pool.selectFrom('dealers').select('shop_id').execute()).map((d) => d.shop_id).sort();
          seen.push({ wanted, got: await names() });
          await pause((i * 7 + step * 3) % 5);
          // A transaction reserves its connection once: its queries carry the same scope.
          seen.push({ wanted, got: await pool.transaction().execute(async (trx) => (await trx.selectFrom('dealers').select('shop_id').execute()).map((d) => d.shop_id).sort()) });
        }
      };
      await Promise.all(
        Array.from({ length: 12 }, (_, i) => {
          const wanted = [shopA, shopB, null][i % 3]!;
          return wanted ? inShopScope(pool, wanted, () => worker(wanted, i)) : worker(null, i);
        }),
      );
      expect(seen).toHaveLength(12 * 8);
      for (const { wanted, got } of seen) expect(got).toEqual(wanted ? [wanted] : [shopA, shopB].sort());
    }
  });

  it('a unique clash with another shop’s row is still recognised, though PostgreSQL hides the clashing value', async () => {
    const { db, shopA, shopB } = await twoShops();
    await db.updateTable('shops').set({ slug: 'taken' }).where('id', '=', shopB).execute();
    const error = await inShopScope(db, shopA, () => db.updateTable('shops').set({ slug: 'taken' }).where('id', '=', shopA).execute()).catch((e: unknown) => e);
    expect(String((error as { detail?: string }).detail ?? '')).not.toContain('taken');
    expect(isUniqueViolation(error, 'slug')).toBe(true);
    expect(isUniqueViolation(error, 'name')).toBe(false);
  });

  it('every table with a shop_id has a forced policy, and the app’s role cannot bypass it', async () => {
    const { db } = await twoShops();
    const { rows } = await sql<{
      table_name: string;
      forced: boolean;
      enabled: boolean;
      policies: number;
    }>`
      select c.table_name, k.relforcerowsecurity as forced, k.relrowsecurity as enabled,
        (select count(*) from pg_policies p where p.tablename = c.table_name) as policies
      from information_schema.columns c join pg_class k on k.relname = c.table_name and k.relnamespace = current_schema()::regnamespace
      where c.table_schema = current_schema() and c.column_name = 'shop_id'`.execute(db);
    expect(rows.length).toBeGreaterThan(20);
    for (const row of rows)
      expect(row, row.table_name).toMatchObject({ forced: true, enabled: true, policies: 1 });
    const role = await sql<{
      rolsuper: boolean;
      rolbypassrls: boolean;
    }>`select rolsuper, rolbypassrls from pg_roles where rolname = current_user`.execute(db);
    expect(role.rows[0]).toEqual({ rolsuper: false, rolbypassrls: false });
  });
});

describe.skipIf(testEngine() !== 'sqlite')('shop scope on SQLite', () => {
  it('is a no-op: the work runs as it is', async () => {
    const { db, shopA } = await twoShops();
    expect(await inShopScope(db, shopA, async () => [shopScope(), await currentShopScope(db)])).toEqual([null, null]);
  });
});
