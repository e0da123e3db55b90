import { sql, type Kysely } from 'kysely';

// Frozen in time: never edit a migration that has shipped; add a new one.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('shops')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('status', 'text', (c) => c.notNull().defaultTo('active'))
    .addColumn('currency', 'text', (c) => c.notNull().defaultTo('USD'))
    .addColumn('settings', 'text', (c) => c.notNull().defaultTo('{}'))
    .addColumn('created_at', 'text', (c) => c.notNull())
    .addColumn('suspended_at', 'text')
    .execute();

  await db.schema
    .createTable('users')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('email', 'text', (c) => c.notNull().unique())
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('password_hash', 'text')
    .addColumn('platform_admin', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('unit_system', 'text', (c) => c.notNull().defaultTo('metric'))
    .addColumn('notification_prefs', 'text', (c) => c.notNull().defaultTo('{}'))
    .addColumn('created_at', 'text', (c) => c.notNull())
    .addColumn('last_sign_in_at', 'text')
    .execute();

  await db.schema
    .createTable('dealers')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id').onDelete('cascade'))
    .addColumn('name', 'text', (c) => c.notNull())
    .addColumn('contact_name', 'text', (c) => c.notNull())
    .addColumn('contact_email', 'text', (c) => c.notNull())
    .addColumn('phone', 'text')
    .addColumn('created_at', 'text', (c) => c.notNull())
    .execute();
  await db.schema.createIndex('dealers_shop_id').on('dealers').column('shop_id').execute();

  await db.schema
    .createTable('memberships')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id').onDelete('cascade'))
    .addColumn('user_id', 'text', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('role', 'text', (c) => c.notNull())
    .addColumn('dealer_id', 'text', (c) => c.references('dealers.id'))
    .addColumn('status', 'text', (c) => c.notNull().defaultTo('active'))
    .addColumn('created_at', 'text', (c) => c.notNull())
    .addUniqueConstraint('memberships_shop_user', ['shop_id', 'user_id'])
    .addCheckConstraint('memberships_role', sql`role in ('owner','tuner','dealer','customer')`)
    .addCheckConstraint('memberships_dealer', sql`(role = 'dealer' and dealer_id is not null) or (role in ('owner','tuner') and dealer_id is null) or role = 'customer'`)
    .execute();
  await db.schema.createIndex('memberships_shop_id').on('memberships').column('shop_id').execute();
  await db.schema.createIndex('memberships_user_id').on('memberships').column('user_id').execute();

  await db.schema
    .createTable('sessions')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('user_id', 'text', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('shop_id', 'text', (c) => c.references('shops.id').onDelete('cascade'))
    .addColumn('created_at', 'integer', (c) => c.notNull())
    .addColumn('expires_at', 'integer', (c) => c.notNull())
    .addColumn('absolute_expires_at', 'integer', (c) => c.notNull())
    .execute();
  await db.schema.createIndex('sessions_user_id').on('sessions').column('user_id').execute();

  await db.schema
    .createTable('invitations')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('shop_id', 'text', (c) => c.notNull().references('shops.id').onDelete('cascade'))
    .addColumn('email', 'text', (c) => c.notNull())
    .addColumn('role', 'text', (c) => c.notNull())
    .addColumn('dealer_id', 'text', (c) => c.references('dealers.id'))
    .addColumn('token_hash', 'text', (c) => c.notNull().unique())
    .addColumn('invited_by_user_id', 'text', (c) => c.references('users.id'))
    .addColumn('created_at', 'text', (c) => c.notNull())
    .addColumn('expires_at', 'text', (c) => c.notNull())
    .addColumn('accepted_at', 'text')
    .addColumn('revoked_at', 'text')
    .execute();
  await db.schema.createIndex('invitations_shop_id').on('invitations').column('shop_id').execute();

  await db.schema
    .createTable('password_resets')
    .addColumn('token_hash', 'text', (c) => c.primaryKey())
    .addColumn('user_id', 'text', (c) => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('created_at', 'text', (c) => c.notNull())
    .addColumn('expires_at', 'text', (c) => c.notNull())
    .addColumn('used_at', 'text')
    .execute();

  await db.schema
    .createTable('audit_events')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('shop_id', 'text', (c) => c.references('shops.id').onDelete('cascade'))
    .addColumn('actor_user_id', 'text', (c) => c.references('users.id'))
    .addColumn('action', 'text', (c) => c.notNull())
    .addColumn('subject_type', 'text', (c) => c.notNull())
    .addColumn('subject_id', 'text')
    .addColumn('details', 'text', (c) => c.notNull().defaultTo('{}'))
    .addColumn('created_at', 'text', (c) => c.notNull())
    .execute();
  await db.schema.createIndex('audit_events_shop_created').on('audit_events').columns(['shop_id', 'created_at']).execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of ['audit_events', 'password_resets', 'invitations', 'sessions', 'memberships', 'dealers', 'users', 'shops']) {
    await db.schema.dropTable(table).execute();
  }
}
