import BetterSqlite3 from 'better-sqlite3';
import { Kysely, SqliteDialect } from 'kysely';
import type { Database } from './database';

export type Db = Kysely<Database>;

/** Opens the embedded SQLite database in WAL mode with foreign keys on. `:memory:` gives a throwaway one. */
export function createDb(filename: string): Db {
  const sqlite = new BetterSqlite3(filename);
  sqlite.pragma('journal_mode = WAL');
  sqlite.pragma('foreign_keys = ON');
  sqlite.pragma('busy_timeout = 5000');
  sqlite.pragma('synchronous = NORMAL');
  return new Kysely<Database>({ dialect: new SqliteDialect({ database: sqlite }) });
}
