import { sql, type Kysely } from 'kysely';
import { onPostgres } from './dialect';

// Frozen in time: never edit a migration that has shipped; add a new one.
// PostgreSQL only (SQLite has no row-level security; there the shop filter in every repository query is the guard):
// every table with a shop_id, and shops itself, shows and accepts only the rows of the shop that the transaction
// named with set_config('app.shop_id', …, true) (see inShopTransaction in row-security.ts). FORCE applies the policy
// to the tables' owner too, so the app may own its tables, as long as it is no superuser and has no BYPASSRLS.
export async function up(db: Kysely<any>): Promise<void> {
  if (!onPostgres(db)) return;
  // Unset or empty = work that is no one shop's (sign-in, webhooks, sweeps, platform admin). Rows without a shop
  // (platform sessions and audit events) are no other shop's rows, so a shop transaction sees them.
  await sql`create function revloop_shop_visible(row_shop_id text) returns boolean language sql stable as $$
    select coalesce(current_setting('app.shop_id', true), '') = '' or row_shop_id is null
      or row_shop_id = current_setting('app.shop_id', true)
  $$`.execute(db);
  const { rows } = await sql<{ table_name: string }>`select table_name from information_schema.columns
    where table_schema = current_schema() and column_name = 'shop_id' order by table_name`.execute(db);
  for (const table of [...rows.map((r) => r.table_name), 'shops']) await shopRowSecurity(db, table);
}

/** Turns on the shop policy for `table` (its shop key is `shop_id`, or `id` for shops); for new shop tables too. */
export async function shopRowSecurity(db: Kysely<any>, table: string): Promise<void> {
  const key = table === 'shops' ? 'id' : 'shop_id';
  await sql`alter table ${sql.table(table)} enable row level security`.execute(db);
  await sql`alter table ${sql.table(table)} force row level security`.execute(db);
  await sql`create policy shop_isolation on ${sql.table(table)}
    using (revloop_shop_visible(${sql.ref(key)})) with check (revloop_shop_visible(${sql.ref(key)}))`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  if (!onPostgres(db)) return;
  const { rows } = await sql<{ tablename: string }>`select tablename from pg_policies where policyname = 'shop_isolation'`.execute(db);
  for (const { tablename } of rows) {
    await sql`drop policy shop_isolation on ${sql.table(tablename)}`.execute(db);
    await sql`alter table ${sql.table(tablename)} no force row level security`.execute(db);
    await sql`alter table ${sql.table(tablename)} disable row level security`.execute(db);
  }
  await sql`drop function revloop_shop_visible(text)`.execute(db);
}
