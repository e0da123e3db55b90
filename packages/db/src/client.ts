import BetterSqlite3 from 'better-sqlite3';
import { Kysely, PostgresAdapter, PostgresDialect, SqliteDialect, sql, type PostgresPool } from 'kysely';
import pg from 'pg';
import type { Database } from './database';
import { shopScope } from './shop-scope-store';

export type Db = Kysely<Database>;

/** Which engine a database (or a transaction on it) runs on. */
export type Dialect = 'sqlite' | 'postgres';

const handles = new WeakMap<Db, BetterSqlite3.Database>();

const STATEMENT_CACHE_SIZE = 500;

/**
 * Kysely prepares every query afresh, which was the largest single cost of a small request: keep the most recently
 * used statements by their SQL text (Kysely's one connection runs one query at a time, so a statement is never busy).
 */
function reusingStatements(sqlite: BetterSqlite3.Database): (source: string) => BetterSqlite3.Statement {
  const statements = new Map<string, BetterSqlite3.Statement>();
  return (source) => {
    let statement = statements.get(source);
    if (statement) statements.delete(source);
    else statement = sqlite.prepare(source);
    statements.set(source, statement);
    if (statements.size > STATEMENT_CACHE_SIZE) statements.delete(statements.keys().next().value!);
    return statement;
  };
}

/** True for a `postgres://` or `postgresql://` connection string (DATABASE_URL); anything else is a SQLite file. */
export function isPostgresUrl(source: string | Buffer): source is string {
  return typeof source === 'string' && /^postgres(ql)?:\/\//i.test(source);
}

// Row values read the same on both engines: SQLite gives JavaScript numbers, so PostgreSQL's bigint (int8: counts,
// epoch milliseconds) and numeric (sums of bigint) come back as numbers too, not strings. Money is in minor units and
// times in milliseconds, both far below 2^53.
const pgTypes = {
  getTypeParser: ((oid: number, format?: 'text' | 'binary') => {
    if (oid === pg.types.builtins.INT8 || oid === pg.types.builtins.NUMERIC) return (value: string) => Number(value);
    return pg.types.getTypeParser(oid, format);
  }) as typeof pg.types.getTypeParser,
};

/**
 * The pool as Kysely sees it: every connection handed out (for one query, or once for a whole transaction) carries the
 * shop scope of the async context that asked for it (inShopScope in row-security.ts) in the session setting
 * `app.shop_id`, which the row-level security policies read; '' when unscoped. Each connection remembers the value it
 * was last given, so a request whose connections already carry its shop pays no extra round trip. (A wrapper rather than
 * Kysely's onReserveConnection hook: a failed set_config must release the connection, or the pool would lose it.)
 */
function shopScopedPool(pool: pg.Pool): PostgresPool {
  const given = new WeakMap<pg.PoolClient, string>();
  return {
    async connect() {
      const client = await pool.connect();
      // Read after the await: the caller's async context is back, so this is the caller's scope.
      const wanted = shopScope() ?? '';
      if ((given.get(client) ?? '') !== wanted) {
        try {
          await client.query("select set_config('app.shop_id', $1, false)", [wanted]);
        } catch (error) {
          client.release(error instanceof Error ? error : true);
          throw error;
        }
        given.set(client, wanted);
      }
      return client;
    },
    end: () => pool.end(),
  };
}

export interface CreateDbOptions {
  /** PostgreSQL only: most connections the pool opens (default 10). */
  poolSize?: number;
}

/**
 * Opens the database. A `postgres://` URL (DATABASE_URL) gives Kysely's PostgreSQL dialect on a `pg` pool; anything
 * else is the embedded SQLite database in WAL mode with foreign keys on. `:memory:` gives a throwaway one; a Buffer
 * from `snapshotDb` gives an in-memory copy of that snapshot.
 */
export function createDb(source: string | Buffer, options: CreateDbOptions = {}): Db {
  if (isPostgresUrl(source)) {
    const pool = new pg.Pool({ connectionString: source, max: options.poolSize ?? 10, types: pgTypes });
    // An idle client that loses its server (restart, failover) emits here; the pool drops it and opens another.
    pool.on('error', () => {});
    return new Kysely<Database>({ dialect: new PostgresDialect({ pool: shopScopedPool(pool) }) });
  }
  const sqlite = new BetterSqlite3(source);
  sqlite.pragma('journal_mode = WAL');
  sqlite.pragma('foreign_keys = ON');
  sqlite.pragma('busy_timeout = 5000');
  sqlite.pragma('synchronous = NORMAL');
  const db = new Kysely<Database>({ dialect: new SqliteDialect({ database: { close: () => sqlite.close(), prepare: reusingStatements(sqlite) } }) });
  handles.set(db, sqlite);
  return db;
}

/** The engine behind `db`; works on a transaction or connection too (it asks the query adapter). */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export function dialectOf(db: Kysely<any>): Dialect {
  return db.getExecutor().adapter instanceof PostgresAdapter ? 'postgres' : 'sqlite';
}

/** One round trip to the database: its engine when it answers, `unreachable` when it does not (readiness checks). */
export async function pingDb(db: Db): Promise<Dialect | 'unreachable'> {
  try {
    await sql`select 1`.execute(db);
    return dialectOf(db);
  } catch {
    return 'unreachable';
  }
}

/** The whole database as bytes (SQLite's serialize), e.g. to give every test its own copy of one seeded database. */
export function snapshotDb(db: Db): Buffer {
  const sqlite = handles.get(db);
  if (!sqlite) throw new Error('Not a SQLite database opened by createDb (snapshots are SQLite only).');
  return sqlite.serialize();
}
