import type { Db } from '../client';
import type { DealerRow, InsertableDealerRow } from './dealer.table';

export async function insertDealer(db: Db, row: InsertableDealerRow): Promise<DealerRow> {
  return db.insertInto('dealers').values(row).returningAll().executeTakeFirstOrThrow();
}

export interface DealerListRow extends DealerRow {
  user_count: number;
  customer_count: number;
}

export async function listDealers(db: Db, shopId: string): Promise<DealerListRow[]> {
  return db
    .selectFrom('dealers')
    .selectAll('dealers')
    .select((eb) => [
      eb
        .selectFrom('memberships')
        .select((e) => e.fn.countAll<number>().as('n'))
        .whereRef('memberships.dealer_id', '=', 'dealers.id')
        .where('memberships.role', '=', 'dealer')
        .as('user_count'),
      eb
        .selectFrom('memberships')
        .select((e) => e.fn.countAll<number>().as('n'))
        .whereRef('memberships.dealer_id', '=', 'dealers.id')
        .where('memberships.role', '=', 'customer')
        .as('customer_count'),
    ])
    .where('dealers.shop_id', '=', shopId)
    .orderBy('dealers.name')
    .execute() as Promise<DealerListRow[]>;
}

export async function findDealer(db: Db, shopId: string, id: string): Promise<DealerRow | undefined> {
  return db.selectFrom('dealers').selectAll().where('shop_id', '=', shopId).where('id', '=', id).executeTakeFirst();
}
