import type { Kysely } from 'kysely';

// Frozen in time: never edit a migration that has shipped; add a new one.
// Kit photos: the image bytes live in the content-addressed blob store; this row is written after the blob is in place.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('kit_photos')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id'))
    .addColumn('kit_id', 'text', (c) => c.notNull().references('kits.id'))
    .addColumn('sha256', 'text', (c) => c.notNull())
    .addColumn('size_bytes', 'integer', (c) => c.notNull())
    .addColumn('content_type', 'text', (c) => c.notNull())
    .addColumn('original_name', 'text', (c) => c.notNull())
    .addColumn('uploaded_by_user_id', 'text', (c) => c.references('users.id'))
    .addColumn('created_at', 'text', (c) => c.notNull())
    .execute();
  await db.schema.createIndex('kit_photos_kit').on('kit_photos').columns(['shop_id', 'kit_id', 'created_at']).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('kit_photos').execute();
}
