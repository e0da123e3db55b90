import { sql, type Kysely } from 'kysely';
import { onPostgres } from './dialect';

const APPEND_ONLY = ['subscription_changes', 'payment_refunds', 'ledger_entries'];

// Frozen in time: never edit a migration that has shipped; add a new one.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('shop_subscriptions')
    .addColumn('shop_id', 'text', (c) => c.primaryKey().references('shops.id').onDelete('cascade'))
    .addColumn('plan_id', 'text', (c) => c.notNull())
    .addColumn('seats', 'integer', (c) => c.notNull())
    .addColumn('status', 'text', (c) => c.notNull())
    .addColumn('trial_ends_at', 'text')
    .addColumn('current_period_end', 'text')
    .addColumn('cancel_at_period_end', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('past_due_since', 'text')
    .addColumn('read_only_reason', 'text')
    .addColumn('stripe_customer_id', 'text', (c) => c.unique())
    .addColumn('stripe_subscription_id', 'text', (c) => c.unique())
    .addColumn('provider_clock', 'text')
    .addColumn('created_at', 'text', (c) => c.notNull())
    .addColumn('updated_at', 'text', (c) => c.notNull())
    .addCheckConstraint('shop_subscriptions_seats', sql`seats > 0`)
    .execute();

  await db.schema
    .createTable('subscription_changes')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id'))
    .addColumn('plan_id', 'text', (c) => c.notNull())
    .addColumn('seats', 'integer', (c) => c.notNull())
    .addColumn('status', 'text', (c) => c.notNull())
    .addColumn('mrr_minor', 'integer', (c) => c.notNull())
    .addColumn('at', 'text', (c) => c.notNull())
    .execute();
  await db.schema.createIndex('subscription_changes_at').on('subscription_changes').columns(['at']).execute();

  await db.schema
    .createTable('subscription_invoices')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id'))
    .addColumn('status', 'text', (c) => c.notNull())
    .addColumn('billing_reason', 'text')
    .addColumn('amount_due_minor', 'integer', (c) => c.notNull())
    .addColumn('amount_paid_minor', 'integer', (c) => c.notNull())
    .addColumn('currency', 'text', (c) => c.notNull())
    .addColumn('period_start', 'text')
    .addColumn('period_end', 'text')
    .addColumn('created_at', 'text', (c) => c.notNull())
    .addColumn('updated_at', 'text', (c) => c.notNull())
    .execute();
  await db.schema.createIndex('subscription_invoices_shop').on('subscription_invoices').columns(['shop_id', 'created_at']).execute();

  await db.schema
    .createTable('stripe_events')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('type', 'text', (c) => c.notNull())
    .addColumn('shop_id', 'text', (c) => c.references('shops.id'))
    .addColumn('received_at', 'text', (c) => c.notNull())
    .execute();

  await db.schema
    .createTable('payments')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id'))
    .addColumn('purpose', 'text', (c) => c.notNull())
    .addColumn('job_id', 'text', (c) => c.references('jobs.id'))
    .addColumn('dealer_id', 'text', (c) => c.references('dealers.id'))
    .addColumn('payer_user_id', 'text', (c) => c.notNull().references('users.id'))
    .addColumn('amount_minor', 'integer', (c) => c.notNull())
    .addColumn('currency', 'text', (c) => c.notNull())
    .addColumn('status', 'text', (c) => c.notNull())
    .addColumn('stripe_checkout_session_id', 'text', (c) => c.notNull().unique())
    .addColumn('stripe_payment_intent_id', 'text', (c) => c.unique())
    .addColumn('created_at', 'text', (c) => c.notNull())
    .addColumn('paid_at', 'text')
    .addCheckConstraint('payments_purpose', sql`(purpose = 'job' and job_id is not null) or (purpose = 'topup' and dealer_id is not null)`)
    .addCheckConstraint('payments_status', sql`status in ('open','paid','expired')`)
    .addCheckConstraint('payments_amount', sql`amount_minor > 0`)
    .execute();
  await db.schema.createIndex('payments_shop_job').on('payments').columns(['shop_id', 'job_id']).execute();

  await db.schema
    .createTable('payment_refunds')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id'))
    .addColumn('payment_id', 'text', (c) => c.notNull().references('payments.id'))
    .addColumn('amount_minor', 'integer', (c) => c.notNull())
    .addColumn('currency', 'text', (c) => c.notNull())
    .addColumn('reason', 'text', (c) => c.notNull())
    .addColumn('stripe_refund_id', 'text', (c) => c.notNull().unique())
    .addColumn('by_user_id', 'text', (c) => c.references('users.id'))
    .addColumn('created_at', 'text', (c) => c.notNull())
    .addCheckConstraint('payment_refunds_amount', sql`amount_minor > 0`)
    .execute();
  await db.schema.createIndex('payment_refunds_payment').on('payment_refunds').columns(['shop_id', 'payment_id']).execute();

  await db.schema
    .createTable('ledger_entries')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id'))
    .addColumn('dealer_id', 'text', (c) => c.notNull().references('dealers.id'))
    .addColumn('seq', 'integer', (c) => c.notNull())
    .addColumn('kind', 'text', (c) => c.notNull())
    .addColumn('amount_minor', 'integer', (c) => c.notNull())
    .addColumn('currency', 'text', (c) => c.notNull())
    .addColumn('balance_after_minor', 'integer', (c) => c.notNull())
    .addColumn('job_id', 'text', (c) => c.references('jobs.id'))
    .addColumn('payment_id', 'text', (c) => c.references('payments.id'))
    .addColumn('memo', 'text', (c) => c.notNull())
    .addColumn('created_by_user_id', 'text', (c) => c.references('users.id'))
    .addColumn('created_at', 'text', (c) => c.notNull())
    .addUniqueConstraint('ledger_entries_dealer_seq', ['dealer_id', 'seq'])
    .addCheckConstraint('ledger_entries_kind', sql`kind in ('top_up','job_debit','job_credit','adjustment')`)
    .addCheckConstraint('ledger_entries_sign', sql`(kind = 'job_debit' and amount_minor < 0) or (kind in ('top_up','job_credit') and amount_minor > 0) or kind = 'adjustment'`)
    .execute();
  // One debit per job and one credit per payment, whatever retries or duplicate webhooks arrive.
  await sql`create unique index ledger_entries_job_kind on ledger_entries (job_id, kind) where job_id is not null`.execute(db);
  await sql`create unique index ledger_entries_payment on ledger_entries (payment_id) where payment_id is not null`.execute(db);

  if (onPostgres(db)) {
    // PostgreSQL triggers call a function; one function refuses the change for every append-only table.
    await sql`create function revloop_append_only() returns trigger language plpgsql as $$
      begin raise exception '% is append-only', tg_table_name; end $$`.execute(db);
    for (const table of APPEND_ONLY) await appendOnlyOnPostgres(db, table);
    return;
  }
  for (const table of APPEND_ONLY) {
    await sql`create trigger ${sql.raw(`${table}_no_update`)} before update on ${sql.table(table)} begin select raise(abort, ${sql.lit(`${table} is append-only`)}); end`.execute(db);
    await sql`create trigger ${sql.raw(`${table}_no_delete`)} before delete on ${sql.table(table)} begin select raise(abort, ${sql.lit(`${table} is append-only`)}); end`.execute(db);
  }
}

/** PostgreSQL: updates and deletes on `table` fail with "<table> is append-only", as SQLite's raise(abort) does. */
export async function appendOnlyOnPostgres(db: Kysely<any>, table: string): Promise<void> {
  for (const event of ['update', 'delete']) {
    await sql`create trigger ${sql.raw(`${table}_no_${event}`)} before ${sql.raw(event)} on ${sql.table(table)} for each row execute function revloop_append_only()`.execute(db);
  }
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of ['ledger_entries', 'payment_refunds', 'payments', 'stripe_events', 'subscription_invoices', 'subscription_changes', 'shop_subscriptions']) {
    await db.schema.dropTable(table).execute();
  }
}
