import { sql, type Kysely } from 'kysely';
import { appendOnlyOnPostgres } from './2026-12-02-005-billing';
import { onPostgres } from './dialect';

// Frozen in time: never edit a migration that has shipped; add a new one.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('kits')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id'))
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('interface_serial', 'text', (c) => c.notNull())
    .addColumn('laptop_asset_tag', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('contents', 'text', (c) => c.notNull().defaultTo('[]'))
    .addColumn('platforms', 'text', (c) => c.notNull().defaultTo('[]'))
    .addColumn('condition_notes', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('status', 'text', (c) => c.notNull())
    .addColumn('weekly_price_minor', 'integer', (c) => c.notNull())
    .addColumn('deposit_minor', 'integer', (c) => c.notNull())
    .addColumn('late_fee_per_day_minor', 'integer', (c) => c.notNull())
    .addColumn('in_service_since', 'text', (c) => c.notNull())
    .addColumn('retired_on', 'text')
    .addColumn('created_at', 'text', (c) => c.notNull())
    .addColumn('updated_at', 'text', (c) => c.notNull())
    .addCheckConstraint('kits_money', sql`weekly_price_minor >= 0 and deposit_minor >= 0 and late_fee_per_day_minor >= 0`)
    .execute();
  await db.schema.createIndex('kits_shop').on('kits').columns(['shop_id', 'name']).execute();

  await db.schema
    .createTable('rentals')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id'))
    .addColumn('job_id', 'text', (c) => c.notNull().references('jobs.id'))
    .addColumn('kit_id', 'text', (c) => c.references('kits.id'))
    .addColumn('customer_user_id', 'text', (c) => c.notNull().references('users.id'))
    .addColumn('dealer_id', 'text', (c) => c.references('dealers.id'))
    .addColumn('state', 'text', (c) => c.notNull())
    .addColumn('start_date', 'text', (c) => c.notNull())
    .addColumn('due_date', 'text', (c) => c.notNull())
    .addColumn('blocked_from', 'text', (c) => c.notNull())
    .addColumn('blocked_to', 'text', (c) => c.notNull())
    .addColumn('notes', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('carrier', 'text')
    .addColumn('tracking_number', 'text')
    .addColumn('shipped_at', 'text')
    .addColumn('delivered_at', 'text')
    .addColumn('received_date', 'text')
    .addColumn('returned_contents', 'text')
    .addColumn('condition', 'text')
    .addColumn('condition_notes', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('cancel_reason', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('terms_accepted_at', 'text')
    .addColumn('currency', 'text', (c) => c.notNull())
    .addColumn('fee_minor', 'integer', (c) => c.notNull())
    .addColumn('deposit_minor', 'integer', (c) => c.notNull())
    .addColumn('late_fee_per_day_minor', 'integer', (c) => c.notNull())
    .addColumn('fee_paid_at', 'text')
    .addColumn('fee_checkout_session_id', 'text')
    .addColumn('setup_checkout_session_id', 'text')
    .addColumn('stripe_customer_id', 'text')
    .addColumn('payment_method_id', 'text')
    .addColumn('deposit_status', 'text', (c) => c.notNull().defaultTo('none'))
    .addColumn('hold_intent_id', 'text')
    .addColumn('hold_minor', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('hold_expires_at', 'text')
    .addColumn('closed_at', 'text')
    .addColumn('created_at', 'text', (c) => c.notNull())
    .addColumn('updated_at', 'text', (c) => c.notNull())
    .addCheckConstraint('rentals_dates', sql`start_date <= due_date and blocked_from <= start_date and due_date <= blocked_to`)
    .execute();
  await db.schema.createIndex('rentals_kit_days').on('rentals').columns(['kit_id', 'blocked_from', 'blocked_to']).execute();
  await db.schema.createIndex('rentals_job').on('rentals').columns(['shop_id', 'job_id']).execute();
  await db.schema.createIndex('rentals_state').on('rentals').columns(['shop_id', 'state', 'due_date']).execute();

  // Money lines the customer sees and the shop exports; append-only. provider_ref makes webhook effects apply once.
  await db.schema
    .createTable('rental_entries')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id'))
    .addColumn('rental_id', 'text', (c) => c.notNull().references('rentals.id'))
    .addColumn('kind', 'text', (c) => c.notNull())
    .addColumn('amount_minor', 'integer', (c) => c.notNull())
    .addColumn('description', 'text', (c) => c.notNull())
    .addColumn('provider_ref', 'text', (c) => c.unique())
    .addColumn('at', 'text', (c) => c.notNull())
    .execute();
  await db.schema.createIndex('rental_entries_rental').on('rental_entries').columns(['rental_id', 'at']).execute();

  // One row per reminder sent: the primary key makes the sweep send each reminder once.
  await db.schema
    .createTable('rental_reminders')
    .addColumn('rental_id', 'text', (c) => c.notNull().references('rentals.id'))
    .addColumn('kind', 'text', (c) => c.notNull())
    .addColumn('day', 'text', (c) => c.notNull())
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id'))
    .addColumn('sent_at', 'text', (c) => c.notNull())
    .addPrimaryKeyConstraint('rental_reminders_pk', ['rental_id', 'kind', 'day'])
    .execute();

  for (const table of ['rental_entries']) {
    if (onPostgres(db)) {
      await appendOnlyOnPostgres(db, table);
      continue;
    }
    await sql
      .raw(`create trigger ${table}_no_update before update on ${table} begin select raise(abort, '${table} is append-only'); end`)
      .execute(db);
    await sql
      .raw(`create trigger ${table}_no_delete before delete on ${table} begin select raise(abort, '${table} is append-only'); end`)
      .execute(db);
  }
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('rental_reminders').execute();
  await db.schema.dropTable('rental_entries').execute();
  await db.schema.dropTable('rentals').execute();
  await db.schema.dropTable('kits').execute();
}
