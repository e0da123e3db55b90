import type { Kysely } from 'kysely';

// Frozen in time: never edit a migration that has shipped; add a new one.
// E-mails a change sends are queued here in the change's own transaction and sent after it commits, so a rolled-back
// change mails nothing and a committed one is not lost if the mail server is down (sent rows are deleted).
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('mail_outbox')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('to_address', 'text', (c) => c.notNull())
    .addColumn('subject', 'text', (c) => c.notNull())
    .addColumn('text', 'text', (c) => c.notNull())
    .addColumn('html', 'text')
    .addColumn('attempts', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('last_error', 'text')
    .addColumn('claimed_at', 'text')
    .addColumn('created_at', 'text', (c) => c.notNull())
    .execute();
  await db.schema.createIndex('mail_outbox_created_at').on('mail_outbox').column('created_at').execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('mail_outbox').execute();
}
