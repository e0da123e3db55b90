import { sql, type Kysely } from 'kysely';

// Frozen in time: never edit a migration that has shipped; add a new one.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('calibration_files')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id').onDelete('cascade'))
    .addColumn('job_id', 'text', (c) => c.notNull().references('jobs.id').onDelete('cascade'))
    .addColumn('module', 'text', (c) => c.notNull())
    .addColumn('kind', 'text', (c) => c.notNull())
    .addColumn('revision_number', 'integer')
    .addColumn('for_round', 'integer')
    .addColumn('parent_file_id', 'text', (c) => c.references('calibration_files.id'))
    .addColumn('notes', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('original_name', 'text', (c) => c.notNull())
    .addColumn('format', 'text', (c) => c.notNull())
    .addColumn('sha256', 'text', (c) => c.notNull())
    .addColumn('crc32', 'integer', (c) => c.notNull())
    .addColumn('size_bytes', 'integer', (c) => c.notNull())
    .addColumn('image_bytes', 'integer', (c) => c.notNull())
    .addColumn('ranges', 'text', (c) => c.notNull())
    .addColumn('uploaded_by_user_id', 'text', (c) => c.notNull().references('users.id'))
    .addColumn('created_at', 'text', (c) => c.notNull())
    .addCheckConstraint('calibration_files_module', sql`module in ('ECM','TCM','other')`)
    .addCheckConstraint('calibration_files_kind', sql`kind in ('read','revision','re_read')`)
    .addCheckConstraint('calibration_files_format', sql`format in ('raw','intel_hex','srec')`)
    .addCheckConstraint(
      'calibration_files_revision_number',
      sql`(kind = 'revision' and revision_number >= 1) or (kind <> 'revision' and revision_number is null)`,
    )
    .execute();
  await db.schema.createIndex('calibration_files_shop_id').on('calibration_files').column('shop_id').execute();
  await db.schema.createIndex('calibration_files_job').on('calibration_files').columns(['shop_id', 'job_id', 'module']).execute();
  // Revision numbers are unique per job and module; two uploads racing for the same number cannot both land.
  await db.schema
    .createIndex('calibration_files_revision')
    .on('calibration_files')
    .columns(['job_id', 'module', 'revision_number'])
    .unique()
    .where(sql.ref('kind'), '=', 'revision')
    .execute();
  // Finds another job's revision with the same image (CRC-32 and size) without a scan.
  await db.schema.createIndex('calibration_files_image').on('calibration_files').columns(['shop_id', 'crc32', 'image_bytes']).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('calibration_files').execute();
}
