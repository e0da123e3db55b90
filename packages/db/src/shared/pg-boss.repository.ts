import { CompiledQuery, sql } from 'kysely';
import type { Db } from '../client';

// The SQL the app's PostgreSQL queue (apps/api/src/queue/pg-boss-queue.ts) runs beside pg-boss's own: pg-boss 10 keeps
// its jobs in the schema `pgboss` of the app's database (table `job`, partitioned by queue name). Read and written
// only here and by pg-boss; no row-level security there (no shop_id), the handlers scope their own work.

/** pg-boss's schema; it creates and migrates it itself when it starts. */
export const PG_BOSS_SCHEMA = 'pgboss';

/** What pg-boss runs its SQL through (its `db` option): here a Kysely database or transaction of ours. */
export interface PgBossExecutor {
  executeSql(text: string, values?: unknown[]): Promise<{ rows: unknown[] }>;
}

/**
 * pg-boss's statements through `db`. Without values the text goes as one simple query, which pg-boss's own
 * multi-statement commands (BEGIN; lock; …; COMMIT) need. When one of those fails half-way (two instances creating
 * the schema at once: the second's CREATE TYPE finds it there), the connection is left inside the aborted
 * transaction, so it is rolled back before it goes back to the pool.
 */
export function pgBossExecutor(db: Db): PgBossExecutor {
  const query = CompiledQuery.raw;
  return {
    executeSql: async (text, values) => {
      if (db.isTransaction) return { rows: (await db.executeQuery(query(text, values ?? []))).rows };
      return db.connection().execute(async (connection) => {
        try {
          return { rows: (await connection.executeQuery(query(text, values ?? []))).rows };
        } catch (error) {
          await connection.executeQuery(query('rollback')).catch(() => undefined);
          throw error;
        }
      });
    },
  };
}

/**
 * Runs `work` in a transaction that holds a lock on (queue, key), so the check "is a job for this key still open?"
 * and the insert that follows are one step for every instance enqueueing the same key.
 */
export function withQueueKeyLock<T>(db: Db, queue: string, key: string, work: (trx: Db) => Promise<T>): Promise<T> {
  return db.transaction().execute(async (trx) => {
    await sql`select pg_advisory_xact_lock(hashtextextended(${`revloop-queue:${queue}:${key}`}, 0))`.execute(trx);
    return work(trx);
  });
}

/**
 * Runs `work` (pg-boss's createQueue and updateQueue, on other connections) while this transaction holds a lock that
 * every instance takes for it: pg-boss 10 makes a table partition per queue, and two instances doing that at once can
 * deadlock each other.
 */
export function holdingQueueSetupLock<T>(db: Db, work: () => Promise<T>): Promise<T> {
  return db.transaction().execute(async (trx) => {
    await sql`select pg_advisory_xact_lock(hashtextextended('revloop-queue:setup', 0))`.execute(trx);
    return work();
  });
}

/** The queues of these names pg-boss has, with the settings PgBossQueue sets (a cheap check before making them). */
export async function listPgBossQueues(db: Db, names: string[]): Promise<Array<{ name: string; policy: string | null; dead_letter: string | null }>> {
  const { rows } = await sql<{ name: string; policy: string | null; dead_letter: string | null }>`select name, policy, dead_letter
    from ${sql.table(`${PG_BOSS_SCHEMA}.queue`)} where name = any(${names}::text[])`.execute(db);
  return rows;
}

/** True when the queue has a job for `key` that is waiting, waiting to retry, or running. */
export async function hasOpenPgBossJob(db: Db, queue: string, key: string): Promise<boolean> {
  const { rows } = await sql<{ one: number }>`select 1 as one from ${sql.table(`${PG_BOSS_SCHEMA}.job`)}
    where name = ${queue} and singleton_key = ${key} and state < 'completed' limit 1`.execute(db);
  return rows.length > 0;
}

/** How many jobs of these queues whose data carries one of `keys` are still waiting, waiting to retry or running. */
export async function countOpenPgBossJobs(db: Db, queues: string[], keys: string[]): Promise<number> {
  if (keys.length === 0) return 0;
  const { rows } = await sql<{ n: number }>`select count(*) as n from ${sql.table(`${PG_BOSS_SCHEMA}.job`)}
    where name = any(${queues}::text[]) and state < 'completed' and data->>'key' = any(${keys}::text[])`.execute(db);
  return Number(rows[0]?.n ?? 0);
}

// A run is told apart from a later run of the same job (after its claim expired) by the started_on it last wrote;
// timestamps come back to JavaScript in whole milliseconds, hence the tolerance.
const sameRun = (startedOn: Date) => sql<boolean>`abs(extract(epoch from (started_on - ${startedOn}::timestamptz))) < 0.002`;

/**
 * The heartbeat of a running job: pg-boss's supervisor fails (and so retries) an active job whose started_on plus
 * its expiry has passed, so a worker that renews started_on keeps its job and a worker that died stops renewing it.
 * Renews only this run's claim (`startedOn`: what the fetch or the last renewal gave) and returns the new one;
 * undefined when the job is no longer this run's (it expired and was put back or taken by another run, or it ended).
 */
export async function renewPgBossJob(db: Db, queue: string, id: string, startedOn: Date): Promise<Date | undefined> {
  const { rows } = await sql<{ started_on: Date }>`update ${sql.table(`${PG_BOSS_SCHEMA}.job`)} set started_on = now()
    where name = ${queue} and id = ${id}::uuid and state = 'active' and ${sameRun(startedOn)}
    returning started_on`.execute(db);
  return rows[0]?.started_on;
}

/**
 * Runs `work` (pg-boss's complete or fail, through the transaction) only while the job is still active in this run
 * (`startedOn` as for renewPgBossJob), holding its row, so a run whose claim expired cannot end a later run's job.
 * False, without running `work`, when the job is no longer this run's.
 */
export function whilePgBossJobIsOurs(db: Db, queue: string, id: string, startedOn: Date, work: (trx: Db) => Promise<unknown>): Promise<boolean> {
  return db.transaction().execute(async (trx) => {
    const { rows } = await sql<{ one: number }>`select 1 as one from ${sql.table(`${PG_BOSS_SCHEMA}.job`)}
      where name = ${queue} and id = ${id}::uuid and state = 'active' and ${sameRun(startedOn)} for update`.execute(trx);
    if (rows.length === 0) return false;
    await work(trx);
    return true;
  });
}
