import type { Db } from './client';

/** Runs `work` in a transaction, or in the caller's when `db` already is one, so a step can join a larger change. */
export function inTransaction<T>(db: Db, work: (trx: Db) => Promise<T>): Promise<T> {
  return db.isTransaction ? work(db) : db.transaction().execute(work);
}
