import { sql, type Kysely } from 'kysely';
import { onPostgres } from './dialect';

// Frozen in time: never edit a migration that has shipped; add a new one.
// PostgreSQL only: `real` there is a 4-byte float (about 7 digits), while SQLite's REAL is an 8-byte double, so stint
// hours read back as 49.584000778 instead of 49.584. The two `real` columns become `double precision`; stint hours are
// worked out again from their times, since the 4-byte values have already lost their digits. SQLite is unchanged.
export async function up(db: Kysely<any>): Promise<void> {
  if (!onPostgres(db)) return;
  await sql`alter table job_stints alter column hours type double precision
    using (extract(epoch from (left_at::timestamptz - entered_at::timestamptz)) / 3600.0)`.execute(db);
  await sql`alter table work_progress alter column fraction type double precision`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  if (!onPostgres(db)) return;
  await sql`alter table work_progress alter column fraction type real`.execute(db);
  await sql`alter table job_stints alter column hours type real`.execute(db);
}
