import type { Db } from '../client';
import type { KitPhotoRow } from './rental.table';

export async function insertKitPhoto(db: Db, row: KitPhotoRow): Promise<KitPhotoRow> {
  return db.insertInto('kit_photos').values(row).returningAll().executeTakeFirstOrThrow();
}

export async function listKitPhotos(db: Db, shopId: string, kitId: string): Promise<KitPhotoRow[]> {
  return db.selectFrom('kit_photos').selectAll().where('shop_id', '=', shopId).where('kit_id', '=', kitId).orderBy('created_at').orderBy('id').execute();
}

export async function findKitPhoto(db: Db, shopId: string, kitId: string, id: string): Promise<KitPhotoRow | undefined> {
  return db.selectFrom('kit_photos').selectAll().where('shop_id', '=', shopId).where('kit_id', '=', kitId).where('id', '=', id).executeTakeFirst();
}

export async function deleteKitPhoto(db: Db, shopId: string, kitId: string, id: string): Promise<boolean> {
  const result = await db.deleteFrom('kit_photos').where('shop_id', '=', shopId).where('kit_id', '=', kitId).where('id', '=', id).executeTakeFirst();
  return Number(result.numDeletedRows) === 1;
}
