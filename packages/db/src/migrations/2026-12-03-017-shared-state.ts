import { sql, type Kysely } from 'kysely';

// Frozen in time: never edit a migration that has shipped; add a new one.
// State that several API instances share, kept in the database instead of one process's memory: secrets every
// instance signs with, sign-in throttling and rate-limit counters, progress of running work, and the table-backed
// work queue used on SQLite. Times are ISO-8601 text; throttle and rate-limit instants are integer milliseconds.
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .createTable('shared_secrets')
    .addColumn('name', 'text', (c) => c.primaryKey())
    .addColumn('value', 'text', (c) => c.notNull())
    .addColumn('created_at', 'text', (c) => c.notNull())
    .execute();

  await db.schema
    .createTable('throttle_hits')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('key', 'text', (c) => c.notNull())
    .addColumn('at_ms', 'bigint', (c) => c.notNull())
    .execute();
  await db.schema.createIndex('throttle_hits_key_at').on('throttle_hits').columns(['key', 'at_ms']).execute();
  await db.schema.createIndex('throttle_hits_at').on('throttle_hits').column('at_ms').execute();

  await db.schema
    .createTable('rate_limit_counters')
    .addColumn('key', 'text', (c) => c.primaryKey())
    .addColumn('hits', 'integer', (c) => c.notNull())
    .addColumn('reset_at_ms', 'bigint', (c) => c.notNull())
    .execute();

  await db.schema
    .createTable('work_progress')
    .addColumn('key', 'text', (c) => c.primaryKey())
    .addColumn('fraction', 'real', (c) => c.notNull())
    .addColumn('updated_at', 'text', (c) => c.notNull())
    .execute();

  await db.schema
    .createTable('queue_jobs')
    .addColumn('id', 'text', (c) => c.primaryKey())
    .addColumn('queue', 'text', (c) => c.notNull())
    /** What the job is about (e.g. a datalog id): one unfinished job per queue and key. */
    .addColumn('key', 'text', (c) => c.notNull())
    .addColumn('payload', 'text', (c) => c.notNull())
    .addColumn('state', 'text', (c) => c.notNull())
    .addColumn('attempts', 'integer', (c) => c.notNull().defaultTo(0))
    .addColumn('max_attempts', 'integer', (c) => c.notNull())
    .addColumn('run_after', 'text', (c) => c.notNull())
    .addColumn('lease_until', 'text')
    .addColumn('locked_by', 'text')
    .addColumn('last_error', 'text')
    .addColumn('created_at', 'text', (c) => c.notNull())
    .addColumn('updated_at', 'text', (c) => c.notNull())
    .execute();
  await db.schema.createIndex('queue_jobs_due').on('queue_jobs').columns(['queue', 'state', 'run_after']).execute();
  // One unfinished job per queue and key, so enqueueing the same work twice (two instances, a retry) adds nothing.
  await db.schema
    .createIndex('queue_jobs_unfinished_key')
    .on('queue_jobs')
    .columns(['queue', 'key'])
    .unique()
    .where(sql.ref('state'), 'in', ['queued', 'running'])
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const table of ['queue_jobs', 'work_progress', 'rate_limit_counters', 'throttle_hits', 'shared_secrets']) {
    await db.schema.dropTable(table).execute();
  }
}
