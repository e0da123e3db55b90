import { randomBytes } from 'node:crypto';
import { sql } from 'kysely';
import pg from 'pg';
import { createDb, type Db } from '../client';
import { migrateToLatest } from '../migrate';

// Test databases for both engines. The PostgreSQL projects (db-pg, api-pg, api-crash-pg) set REVLOOP_TEST_DB=postgres,
// and their global setup (tests/with-postgres.ts) leaves the server's addresses and a migrated template in the
// environment.

export const testEngine = (): 'sqlite' | 'postgres' => (process.env.REVLOOP_TEST_DB === 'postgres' ? 'postgres' : 'sqlite');

const opened: Array<{ db: Db; name: string; url: string }> = [];
let fileDb: { db: Db; tables: string[] } | undefined;

/**
 * A fresh, migrated, empty database: in-memory SQLite, or on PostgreSQL the test file's own copy of the template,
 * emptied again (TRUNCATE of every table, far quicker than another copy) when a later test of the file asks.
 */
export async function createTestDb(): Promise<Db> {
  if (testEngine() === 'sqlite') {
    const db = createDb(':memory:');
    await migrateToLatest(db);
    return db;
  }
  if (fileDb) {
    await sql`truncate ${sql.join(fileDb.tables.map((t) => sql.table(t)))} cascade`.execute(fileDb.db);
    return fileDb.db;
  }
  const db = await copyTemplate();
  const { rows } = await sql<{ name: string }>`select tablename as name from pg_tables
    where schemaname = current_schema() and tablename not like 'kysely\\_%'`.execute(db);
  fileDb = { db, tables: rows.map((r) => r.name) };
  return db;
}

/** A new database copied from the migrated template (CREATE DATABASE … TEMPLATE), dropped when the file ends. */
export async function copyTemplate(): Promise<Db> {
  const adminUrl = process.env.REVLOOP_PG_TEST_ADMIN_URL;
  const appUrl = process.env.REVLOOP_PG_TEST_APP_URL;
  const template = process.env.REVLOOP_PG_TEST_TEMPLATE;
  if (!adminUrl || !appUrl || !template) throw new Error('REVLOOP_TEST_DB=postgres needs the global setup tests/with-postgres.ts.');
  const name = `${template.replace('_template_', '_')}_${randomBytes(6).toString('hex')}`.replace(/^revloop_test_/, 'revloop_test_db_');
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  try {
    await client.query(`create database ${name} template ${template}`);
  } finally {
    await client.end();
  }
  const url = appUrl.replace('{database}', name);
  const db = createDb(url, { poolSize: 4 });
  opened.push({ db, name, url });
  return db;
}

/** The address of a database copyTemplate made, for a server process started on it (DATABASE_URL). */
export function testDbUrl(db: Db): string {
  const found = opened.find((o) => o.db === db);
  if (!found) throw new Error('Not a PostgreSQL test database made by copyTemplate.');
  return found.url;
}

/** Closes every PostgreSQL test database this worker opened and drops it (a setup file calls it after each file). */
export async function dropTestDbs(): Promise<void> {
  const adminUrl = process.env.REVLOOP_PG_TEST_ADMIN_URL;
  fileDb = undefined;
  const all = opened.splice(0);
  // A test app may have closed its database already; a second destroy only complains.
  await Promise.all(all.map(({ db }) => db.destroy().catch(() => undefined)));
  if (!adminUrl || all.length === 0) return;
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  try {
    for (const { name } of all) await client.query(`drop database if exists ${name} with (force)`);
  } finally {
    await client.end();
  }
}
