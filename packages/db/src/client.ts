import BetterSqlite3 from 'better-sqlite3';
import { Kysely, SqliteDialect } from 'kysely';
import type { Database } from './database';

export type Db = Kysely<Database>;

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

/**
 * Opens the embedded SQLite database in WAL mode with foreign keys on. `:memory:` gives a throwaway one; a
 * Buffer from `snapshotDb` gives an in-memory copy of that snapshot.
 */
export function createDb(source: string | Buffer): Db {
  const sqlite = new BetterSqlite3(source);
  sqlite.pragma('journal_mode = WAL');
  sqlite.pragma('foreign_keys = ON');
  sqlite.pragma('busy_timeout = 5000');
  sqlite.pragma('synchronous = NORMAL');
  const db = new Kysely<Database>({ dialect: new SqliteDialect({ database: { close: () => sqlite.close(), prepare: reusingStatements(sqlite) } }) });
  handles.set(db, sqlite);
  return db;
}

/** The whole database as bytes (SQLite's serialize), e.g. to give every test its own copy of one seeded database. */
export function snapshotDb(db: Db): Buffer {
  const sqlite = handles.get(db);
  if (!sqlite) throw new Error('Not a database opened by createDb.');
  return sqlite.serialize();
}
