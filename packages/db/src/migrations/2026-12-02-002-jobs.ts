import { sql, type Kysely } from 'kysely';

// Frozen in time: never edit a migration that has shipped; add a new one.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('vehicles')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id').onDelete('cascade'))
    .addColumn('owner_user_id', 'text', (c) => c.notNull().references('users.id'))
    .addColumn('dealer_id', 'text', (c) => c.references('dealers.id'))
    .addColumn('vin', 'text', (c) => c.notNull())
    .addColumn('model_year', 'integer', (c) => c.notNull())
    .addColumn('description', 'text', (c) => c.notNull())
    .addColumn('spec', 'text', (c) => c.notNull())
    .addColumn('created_at', 'text', (c) => c.notNull())
    .addColumn('updated_at', 'text', (c) => c.notNull())
    .execute();
  await db.schema.createIndex('vehicles_shop_id').on('vehicles').column('shop_id').execute();
  await db.schema.createIndex('vehicles_owner').on('vehicles').columns(['shop_id', 'owner_user_id']).execute();

  await db.schema
    .createTable('packages')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id').onDelete('cascade'))
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('description', 'text', (c) => c.notNull().defaultTo(''))
    .addColumn('modules', 'text', (c) => c.notNull())
    .addColumn('retail_price_minor', 'integer', (c) => c.notNull())
    .addColumn('dealer_price_minor', 'integer', (c) => c.notNull())
    .addColumn('rounds_included', 'integer', (c) => c.notNull())
    .addColumn('active', 'integer', (c) => c.notNull().defaultTo(1))
    .addColumn('created_at', 'text', (c) => c.notNull())
    .addCheckConstraint('packages_prices', sql`retail_price_minor >= 0 and dealer_price_minor >= 0 and dealer_price_minor <= retail_price_minor`)
    .execute();
  await db.schema.createIndex('packages_shop_id').on('packages').column('shop_id').execute();

  await db.schema
    .createTable('jobs')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id').onDelete('cascade'))
    .addColumn('number', 'integer', (c) => c.notNull())
    .addColumn('vehicle_id', 'text', (c) => c.notNull().references('vehicles.id'))
    .addColumn('customer_user_id', 'text', (c) => c.notNull().references('users.id'))
    .addColumn('dealer_id', 'text', (c) => c.references('dealers.id'))
    .addColumn('package_id', 'text', (c) => c.notNull().references('packages.id'))
    .addColumn('assigned_tuner_id', 'text', (c) => c.references('users.id'))
    .addColumn('state', 'text', (c) => c.notNull())
    .addColumn('held_from', 'text')
    .addColumn('round', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('has_stock_read', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('has_revision_for_round', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('has_log_for_round', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('goals', 'text', (c) => c.notNull())
    .addColumn('special_requests', 'text', (c) => c.notNull().defaultTo('{}'))
    .addColumn('log_request', 'text', (c) => c.notNull())
    .addColumn('cautions_accepted_at', 'text', (c) => c.notNull())
    .addColumn('state_changed_at', 'text', (c) => c.notNull())
    .addColumn('created_by_user_id', 'text', (c) => c.references('users.id'))
    .addColumn('created_at', 'text', (c) => c.notNull())
    .addColumn('updated_at', 'text', (c) => c.notNull())
    .addUniqueConstraint('jobs_shop_number', ['shop_id', 'number'])
    .addCheckConstraint(
      'jobs_state',
      sql`state in ('intake','ready','on_bench','with_customer','log_review','dialed_in','on_hold','cancelled')`,
    )
    .execute();
  await db.schema.createIndex('jobs_shop_state').on('jobs').columns(['shop_id', 'state']).execute();
  await db.schema.createIndex('jobs_shop_customer').on('jobs').columns(['shop_id', 'customer_user_id']).execute();
  await db.schema.createIndex('jobs_shop_dealer').on('jobs').columns(['shop_id', 'dealer_id']).execute();
  await db.schema.createIndex('jobs_shop_tuner').on('jobs').columns(['shop_id', 'assigned_tuner_id']).execute();

  await db.schema
    .createTable('job_messages')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id').onDelete('cascade'))
    .addColumn('job_id', 'text', (c) => c.notNull().references('jobs.id').onDelete('cascade'))
    .addColumn('author_user_id', 'text', (c) => c.notNull().references('users.id'))
    .addColumn('body', 'text', (c) => c.notNull())
    .addColumn('created_at', 'text', (c) => c.notNull())
    .execute();
  await db.schema.createIndex('job_messages_job').on('job_messages').columns(['shop_id', 'job_id', 'created_at']).execute();

  await db.schema
    .createTable('notifications')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id').onDelete('cascade'))
    .addColumn('user_id', 'text', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('job_id', 'text', (c) => c.references('jobs.id').onDelete('cascade'))
    .addColumn('kind', 'text', (c) => c.notNull())
    .addColumn('title', 'text', (c) => c.notNull())
    .addColumn('body', 'text', (c) => c.notNull())
    .addColumn('read_at', 'text')
    .addColumn('created_at', 'text', (c) => c.notNull())
    .execute();
  await db.schema.createIndex('notifications_user').on('notifications').columns(['shop_id', 'user_id', 'created_at']).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of ['notifications', 'job_messages', 'jobs', 'packages', 'vehicles']) {
    await db.schema.dropTable(table).execute();
  }
}
