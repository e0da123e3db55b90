import type { Db } from '../client';
import type { InsertablePackageRow, PackageRow, UpdateablePackageRow } from './package.table';

export async function insertPackage(db: Db, row: InsertablePackageRow): Promise<PackageRow> {
  return db.insertInto('packages').values(row).returningAll().executeTakeFirstOrThrow();
}

export async function findPackage(db: Db, shopId: string, id: string): Promise<PackageRow | undefined> {
  return db.selectFrom('packages').selectAll().where('shop_id', '=', shopId).where('id', '=', id).executeTakeFirst();
}

export async function listPackages(db: Db, shopId: string, options: { activeOnly?: boolean } = {}): Promise<PackageRow[]> {
  let query = db.selectFrom('packages').selectAll().where('shop_id', '=', shopId);
  if (options.activeOnly) query = query.where('active', '=', 1);
  return query.orderBy('retail_price_minor').execute();
}

export async function updatePackage(db: Db, shopId: string, id: string, patch: UpdateablePackageRow): Promise<PackageRow | undefined> {
  return db.updateTable('packages').set(patch).where('shop_id', '=', shopId).where('id', '=', id).returningAll().executeTakeFirst();
}
