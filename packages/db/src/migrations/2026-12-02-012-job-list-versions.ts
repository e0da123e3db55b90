import { sql, type Kysely } from 'kysely';
import { onPostgres } from './dialect';

// Frozen in time: never edit a migration that has shipped; add a new one.
// A per-shop counter of everything a job list shows, bumped by triggers in the same transaction as the write, so any
// API instance can tell with one key read whether a list it answered before is still the answer.
/** Each table whose columns a job list shows, the shops a changed row touches, and the columns that matter. */
const WATCHED: Array<{ table: string; shopsOf: (row: 'new' | 'old') => string; columns?: string }> = [
  { table: 'jobs', shopsOf: (r) => `select ${r}.shop_id as shop_id` },
  { table: 'vehicles', shopsOf: (r) => `select ${r}.shop_id as shop_id`, columns: 'shop_id, description, vin, model_year' },
  { table: 'packages', shopsOf: (r) => `select ${r}.shop_id as shop_id`, columns: 'shop_id, name' },
  { table: 'dealers', shopsOf: (r) => `select ${r}.shop_id as shop_id`, columns: 'shop_id, name' },
  // A person's name or e-mail shows on the jobs of every shop they belong to.
  { table: 'users', shopsOf: (r) => `select shop_id from memberships where user_id = ${r}.id`, columns: 'name, email' },
];

// `where true` tells SQLite's parser that the upsert's `on conflict` belongs to the insert, not to the select.
const bump = (shops: string) =>
  `insert into job_list_versions (shop_id, version) select shop_id, 1 from (${shops}) where true
    on conflict (shop_id) do update set version = version + 1;`;

export async function up(db: Kysely<any>): Promise<void> {
  if (onPostgres(db)) return listVersionsOnPostgres(db);
  await sql`create table job_list_versions (
    shop_id text primary key references shops(id) on delete cascade,
    version integer not null
  ) without rowid`.execute(db);
  for (const { table, shopsOf, columns } of WATCHED) {
    await sql.raw(`create trigger ${table}_list_version_insert after insert on ${table} begin ${bump(shopsOf('new'))} end`).execute(db);
    await sql.raw(`create trigger ${table}_list_version_update after update${columns ? ` of ${columns}` : ''} on ${table} begin ${bump(shopsOf('new'))} end`).execute(db);
    await sql.raw(`create trigger ${table}_list_version_delete after delete on ${table} begin ${bump(shopsOf('old'))} end`).execute(db);
  }
}

// PostgreSQL: the same counter, one trigger function per watched table (a trigger runs a function, not statements).
async function listVersionsOnPostgres(db: Kysely<any>): Promise<void> {
  await sql`create table job_list_versions (
    shop_id text primary key references shops(id) on delete cascade,
    version bigint not null
  )`.execute(db);
  // A shop being deleted takes its counter with it: its rows' delete triggers must not write a new one.
  const bumpPg = (shops: string) =>
    `insert into job_list_versions (shop_id, version) select shop_id, 1 from (${shops}) as s
      where exists (select 1 from shops where shops.id = s.shop_id)
      on conflict (shop_id) do update set version = job_list_versions.version + 1;`;
  for (const { table, shopsOf, columns } of WATCHED) {
    await sql
      .raw(
        `create function ${table}_list_version() returns trigger language plpgsql as $$
        begin
          if tg_op = 'DELETE' then ${bumpPg(shopsOf('old'))} else ${bumpPg(shopsOf('new'))} end if;
          return null;
        end $$`,
      )
      .execute(db);
    await sql.raw(`create trigger ${table}_list_version_insert after insert on ${table} for each row execute function ${table}_list_version()`).execute(db);
    await sql.raw(`create trigger ${table}_list_version_update after update${columns ? ` of ${columns}` : ''} on ${table} for each row execute function ${table}_list_version()`).execute(db);
    await sql.raw(`create trigger ${table}_list_version_delete after delete on ${table} for each row execute function ${table}_list_version()`).execute(db);
  }
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const { table } of WATCHED) {
    for (const event of ['insert', 'update', 'delete']) await sql.raw(`drop trigger ${table}_list_version_${event}`).execute(db);
  }
  await db.schema.dropTable('job_list_versions').execute();
}
