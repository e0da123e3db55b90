import { sql, type Expression, type RawBuilder, type SqlBool } from 'kysely';
import { dialectOf, type Db } from './client';

// The few SQL pieces that SQLite and PostgreSQL spell differently, decided here once, so repositories never branch on
// the engine. Each takes the database (or transaction) the query will run on. Pieces both engines read alike are
// plain constants.

/** A condition that is never true (`where 0` is not a boolean on PostgreSQL). */
export const sqlFalse: RawBuilder<SqlBool> = sql<SqlBool>`1 = 0`;

/** How many rows meet `condition`, inside an aggregate query (`sum(a = b)` sums booleans only on SQLite). */
export const countWhere = (condition: RawBuilder<unknown>): RawBuilder<number> => sql<number>`sum(case when ${condition} then 1 else 0 end)`;

/** The operator of a search that ignores ASCII case: SQLite's `like` already does; PostgreSQL's needs `ilike`. */
export const caseBlindLike = (db: Db): 'like' | 'ilike' => (dialectOf(db) === 'postgres' ? 'ilike' : 'like');

/** A top-level key of a JSON text column, as text (`'$.key'` in SQLite, `->>` on PostgreSQL). */
export function jsonText(db: Db, column: string, key: string): RawBuilder<string | null> {
  return dialectOf(db) === 'postgres'
    ? sql<string | null>`(${sql.ref(column)}::jsonb ->> ${sql.lit(key)})`
    : sql<string | null>`json_extract(${sql.ref(column)}, ${sql.lit(`$.${key}`)})`;
}

/** A top-level key of a JSON text column, as a number. */
export function jsonNumber(db: Db, column: string, key: string): RawBuilder<number | null> {
  return dialectOf(db) === 'postgres'
    ? sql<number | null>`((${sql.ref(column)}::jsonb ->> ${sql.lit(key)})::double precision)`
    : sql<number | null>`json_extract(${sql.ref(column)}, ${sql.lit(`$.${key}`)})`;
}

/** Hours from `earlier` to `later`, both ISO-8601 texts (the stored form of every time column). */
export function hoursBetween(db: Db, later: Expression<unknown> | RawBuilder<unknown>, earlier: Expression<unknown> | RawBuilder<unknown>): RawBuilder<number | null> {
  return dialectOf(db) === 'postgres'
    ? sql<number | null>`(extract(epoch from ((${later})::timestamptz - (${earlier})::timestamptz)) / 3600.0)`
    : sql<number | null>`((julianday(${later}) - julianday(${earlier})) * 24)`;
}

/** The whole part of a non-negative number (SQLite's cast to integer truncates; PostgreSQL's rounds). */
export function wholePart(db: Db, value: RawBuilder<unknown>): RawBuilder<number> {
  return dialectOf(db) === 'postgres' ? sql<number>`trunc(${value})` : sql<number>`cast(${value} as integer)`;
}

/** The values of an aggregate group joined by `separator` (group_concat / string_agg). */
export function joinedText(db: Db, value: RawBuilder<unknown>, separator: string): RawBuilder<string | null> {
  return dialectOf(db) === 'postgres'
    ? sql<string | null>`string_agg(${value}, ${sql.lit(separator)})`
    : sql<string | null>`group_concat(${value}, ${sql.lit(separator)})`;
}

/** The largest of several values in one row (SQLite's multi-argument max, PostgreSQL's greatest). */
export function largestOf(db: Db, ...values: RawBuilder<unknown>[]): RawBuilder<string> {
  return dialectOf(db) === 'postgres' ? sql<string>`greatest(${sql.join(values)})` : sql<string>`max(${sql.join(values)})`;
}

/** The column names of `table`, in their order (SQLite's pragma_table_info, PostgreSQL's information_schema). */
export async function columnsOf(db: Db, table: string): Promise<string[]> {
  const { rows } =
    dialectOf(db) === 'postgres'
      ? await sql<{ name: string }>`select column_name as name from information_schema.columns
          where table_schema = current_schema() and table_name = ${table} order by ordinal_position`.execute(db)
      : await sql<{ name: string }>`select name from pragma_table_info(${table})`.execute(db);
  return rows.map((r) => r.name);
}
