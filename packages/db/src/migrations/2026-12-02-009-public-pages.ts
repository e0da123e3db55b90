import type { Kysely } from 'kysely';

// Frozen in time: never edit a migration that has shipped; add a new one.
// A shop's public page (slug, description, on/off) and the sign-ups from it that wait for their e-mailed link.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('shops').addColumn('slug', 'text').execute();
  await db.schema.alterTable('shops').addColumn('description', 'text', (c) => c.notNull().defaultTo('')).execute();
  await db.schema.alterTable('shops').addColumn('public_page', 'integer', (c) => c.notNull().defaultTo(0)).execute();
  // Shops without a slug keep null, and nulls never clash in a unique index.
  await db.schema.createIndex('shops_slug').unique().on('shops').column('slug').execute();

  await db.schema
    .createTable('public_sign_ups')
    .addColumn('token_hash', 'text', (c) => c.primaryKey())
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id').onDelete('cascade'))
    .addColumn('email', 'text', (c) => c.notNull())
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('password_hash', 'text', (c) => c.notNull())
    .addColumn('intake', 'text', (c) => c.notNull())
    .addColumn('created_at', 'text', (c) => c.notNull())
    .addColumn('expires_at', 'text', (c) => c.notNull())
    .addColumn('used_at', 'text')
    .execute();
  await db.schema.createIndex('public_sign_ups_shop_id').on('public_sign_ups').column('shop_id').execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('public_sign_ups').execute();
  await db.schema.dropIndex('shops_slug').execute();
  await db.schema.alterTable('shops').dropColumn('public_page').execute();
  await db.schema.alterTable('shops').dropColumn('description').execute();
  await db.schema.alterTable('shops').dropColumn('slug').execute();
}
