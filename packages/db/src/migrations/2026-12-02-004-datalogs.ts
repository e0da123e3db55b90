import { sql, type Kysely } from 'kysely';

// Frozen in time: never edit a migration that has shipped; add a new one.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('datalogs')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id').onDelete('cascade'))
    .addColumn('job_id', 'text', (c) => c.notNull().references('jobs.id').onDelete('cascade'))
    .addColumn('round', 'integer', (c) => c.notNull())
    .addColumn('original_name', 'text', (c) => c.notNull())
    .addColumn('sha256', 'text', (c) => c.notNull())
    .addColumn('size_bytes', 'integer', (c) => c.notNull())
    .addColumn('header_signature', 'text', (c) => c.notNull())
    .addColumn('mapping', 'text', (c) => c.notNull())
    .addColumn('fuel', 'text', (c) => c.notNull())
    .addColumn('status', 'text', (c) => c.notNull())
    .addColumn('error', 'text')
    .addColumn('report', 'text')
    .addColumn('uploaded_by', 'text', (c) => c.references('users.id'))
    .addColumn('created_at', 'text', (c) => c.notNull())
    .addCheckConstraint('datalogs_status', sql`status in ('processing','ready','failed')`)
    .execute();
  await db.schema.createIndex('datalogs_shop_id').on('datalogs').column('shop_id').execute();
  await db.schema.createIndex('datalogs_job').on('datalogs').columns(['shop_id', 'job_id', 'created_at']).execute();

  await db.schema
    .createTable('datalog_mappings')
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id').onDelete('cascade'))
    .addColumn('header_signature', 'text', (c) => c.notNull())
    .addColumn('mapping', 'text', (c) => c.notNull())
    .addColumn('updated_at', 'text', (c) => c.notNull())
    .addPrimaryKeyConstraint('datalog_mappings_pk', ['shop_id', 'header_signature'])
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('datalog_mappings').execute();
  await db.schema.dropTable('datalogs').execute();
}
