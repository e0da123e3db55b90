import { sql } from 'kysely';
import { describe, expect, it } from 'vitest';
import { insertDealer } from './dealers/dealer.repository';
import { newId, nowIso } from './ids';
import { currentShopScope, inShopTransaction } from './row-security';
import { testEngine } from './testing/postgres';
import { twoShops } from './testing/two-shops';

async function dealerIn(
  db: Awaited<ReturnType<typeof twoShops>>['db'],
  shopId: string,
  name: string,
) {
  return insertDealer(db, {
    id: newId(),
    shop_id: shopId,
    name,
    contact_name: name,
    contact_email: `${newId()}@example.test`,
    created_at: nowIso(),
  });
}

describe.skipIf(testEngine() !== 'postgres')('row-level security on PostgreSQL', () => {
  it('a query without the shop filter, inside a shop transaction, sees and changes only that shop’s rows', async () => {
    const { db, shopA, shopB } = await twoShops();
    await dealerIn(db, shopA, 'Dealer of A');
    const ofB = await dealerIn(db, shopB, 'Dealer of B');

    // Deliberately no `where shop_id = …`: the policy alone keeps shop B out.
    const seen = await inShopTransaction(db, shopA, (trx) =>
      trx.selectFrom('dealers').select(['name', 'shop_id']).execute(),
    );
    expect(seen).toEqual([{ name: 'Dealer of A', shop_id: shopA }]);
    const memberships = await inShopTransaction(db, shopA, (trx) =>
      trx.selectFrom('memberships').select('shop_id').execute(),
    );
    expect(memberships.map((m) => m.shop_id)).toEqual([shopA]);
    const shops = await inShopTransaction(db, shopA, (trx) =>
      trx.selectFrom('shops').select('id').execute(),
    );
    expect(shops.map((s) => s.id)).toEqual([shopA]);

    // An unfiltered update or delete reaches no other shop's row either.
    await inShopTransaction(db, shopA, (trx) =>
      trx.updateTable('dealers').set({ phone: '555-0100' }).execute(),
    );
    await inShopTransaction(db, shopA, (trx) =>
      trx.deleteFrom('dealers').where('id', '=', ofB.id).execute(),
    );
    const b = await db
      .selectFrom('dealers')
      .selectAll()
      .where('id', '=', ofB.id)
      .executeTakeFirstOrThrow();
    expect(b.phone).toBeNull();

    // Nor can a shop transaction write a row into another shop.
    await expect(
      inShopTransaction(db, shopA, (trx) => dealerIn(trx, shopB, 'Smuggled')),
    ).rejects.toThrow(/row-level security/);
    expect(
      await db.selectFrom('dealers').select('name').where('name', '=', 'Smuggled').execute(),
    ).toEqual([]);
  });

  it('the scope lasts for its transaction only, and a nested scope gives the outer one back', async () => {
    const { db, shopA, shopB } = await twoShops();
    await db.transaction().execute(async (trx) => {
      await inShopTransaction(trx, shopA, async (inner) => {
        await inShopTransaction(inner, shopB, async (nested) =>
          expect(await currentShopScope(nested)).toBe(shopB),
        );
        expect(await currentShopScope(inner)).toBe(shopA);
      });
      expect(await currentShopScope(trx)).toBeNull();
    });
    expect(await currentShopScope(db)).toBeNull();
    // Unscoped work (sign-in, webhooks, sweeps) sees every shop.
    expect((await db.selectFrom('shops').select('id').execute()).map((s) => s.id).sort()).toEqual(
      [shopA, shopB].sort(),
    );
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
