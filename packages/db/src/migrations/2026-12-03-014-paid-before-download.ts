import type { Kysely } from 'kysely';

// Frozen in time: never edit a migration that has shipped; add a new one.
// Paid before download: a shop (on by default) keeps a retail customer's sent revisions locked until the job is paid;
// the owner may waive the lock for one job, and the job remembers who waived it and when.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('shops').addColumn('paid_before_download', 'integer', (c) => c.notNull().defaultTo(1)).execute();
  await db.schema.alterTable('jobs').addColumn('payment_lock_waived_at', 'text').execute();
  await db.schema.alterTable('jobs').addColumn('payment_lock_waived_by_user_id', 'text', (c) => c.references('users.id')).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('jobs').dropColumn('payment_lock_waived_by_user_id').execute();
  await db.schema.alterTable('jobs').dropColumn('payment_lock_waived_at').execute();
  await db.schema.alterTable('shops').dropColumn('paid_before_download').execute();
}
