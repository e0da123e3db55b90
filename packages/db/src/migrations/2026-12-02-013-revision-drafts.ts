import type { Kysely } from 'kysely';

// Frozen in time: never edit a migration that has shipped; add a new one.
// Revision drafts: a revision stays with the shop until "Send revision" stores its note; a shop may ask for a second
// person's approval of each draft first, and the board finds the jobs waiting for one.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('shops').addColumn('revision_approval', 'integer', (c) => c.notNull().defaultTo(0)).execute();
  await db.schema.alterTable('calibration_files').addColumn('approval_required', 'integer', (c) => c.notNull().defaultTo(0)).execute();
  await db.schema.alterTable('calibration_files').addColumn('approved_by_user_id', 'text', (c) => c.references('users.id')).execute();
  await db.schema.alterTable('calibration_files').addColumn('approved_at', 'text').execute();
  await db.schema.alterTable('calibration_files').addColumn('sent_at', 'text').execute();
  await db.schema.alterTable('calibration_files').addColumn('send_note', 'text').execute();
  await db.schema.alterTable('jobs').addColumn('drafts_awaiting_approval', 'integer', (c) => c.notNull().defaultTo(0)).execute();
  await db.schema.createIndex('jobs_drafts_awaiting_approval').on('jobs').columns(['shop_id', 'drafts_awaiting_approval']).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropIndex('jobs_drafts_awaiting_approval').execute();
  await db.schema.alterTable('jobs').dropColumn('drafts_awaiting_approval').execute();
  for (const column of ['send_note', 'sent_at', 'approved_at', 'approved_by_user_id', 'approval_required']) {
    await db.schema.alterTable('calibration_files').dropColumn(column).execute();
  }
  await db.schema.alterTable('shops').dropColumn('revision_approval').execute();
}
