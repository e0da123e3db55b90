import BetterSqlite3 from 'better-sqlite3';
import { Kysely, SqliteDialect } from 'kysely';
import type { Database } from './database';

export type Db = Kysely<Database>;

const handles = new WeakMap<Db, BetterSqlite3.Database>();

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
  const db = new Kysely<Database>({ dialect: new SqliteDialect({ database: sqlite }) });
  handles.set(db, sqlite);
  return db;
}

/** The whole database as bytes (SQLite's serialize), e.g. to give every test its own copy of one seeded database. */
export function snapshotDb(db: Db): Buffer {
  const sqlite = handles.get(db);
  if (!sqlite) throw new Error('Not a database opened by createDb.');
  return sqlite.serialize();
}
