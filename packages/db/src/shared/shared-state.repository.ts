import { sql } from 'kysely';
import type { Db } from '../client';
import { newId } from '../ids';

/**
 * The secret named `name`, made once for every instance: the first caller's `candidate` is stored and every later
 * caller (in any process) reads that one back.
 */
export async function sharedSecret(db: Db, name: string, candidate: string, at: Date): Promise<string> {
  await db
    .insertInto('shared_secrets')
    .values({ name, value: candidate, created_at: at.toISOString() })
    .onConflict((oc) => oc.column('name').doNothing())
    .execute();
  const row = await db.selectFrom('shared_secrets').select('value').where('name', '=', name).executeTakeFirstOrThrow();
  return row.value;
}

/**
 * Serialises writers of the given keys until the transaction ends. SQLite already allows one writer at a time (the
 * first write of a transaction takes the lock); PostgreSQL needs an advisory lock per key. Call inside a transaction.
 */
export async function lockKeys(trx: Db, keys: string[]): Promise<void> {
  if (trx.getExecutor().adapter.constructor.name !== 'PostgresAdapter') return;
  for (const key of [...keys].sort()) await sql`select pg_advisory_xact_lock(hashtext(${key}))`.execute(trx);
}

/** Records one hit per key at `atMs` and returns the new rows' ids. */
export async function recordThrottleHits(db: Db, keys: string[], atMs: number): Promise<string[]> {
  const rows = keys.map((key) => ({ id: newId(), key, at_ms: atMs }));
  if (rows.length) await db.insertInto('throttle_hits').values(rows).execute();
  return rows.map((r) => r.id);
}

/** Hit times of a key since `sinceMs` (exclusive), oldest first, leaving out the given rows. */
export async function throttleHitTimes(db: Db, key: string, sinceMs: number, except: string[] = []): Promise<number[]> {
  let query = db.selectFrom('throttle_hits').select('at_ms').where('key', '=', key).where('at_ms', '>', sinceMs);
  if (except.length) query = query.where('id', 'not in', except);
  const rows = await query.orderBy('at_ms').execute();
  return rows.map((r) => Number(r.at_ms));
}

export async function deleteThrottleHits(db: Db, ids: string[]): Promise<void> {
  if (ids.length) await db.deleteFrom('throttle_hits').where('id', 'in', ids).execute();
}

export async function clearThrottleKey(db: Db, key: string): Promise<void> {
  await db.deleteFrom('throttle_hits').where('key', '=', key).execute();
}

export async function pruneThrottleHits(db: Db, beforeMs: number): Promise<void> {
  await db.deleteFrom('throttle_hits').where('at_ms', '<=', beforeMs).execute();
}

/** Adds a hit to a fixed-window counter, opening a new window when the old one has ended; returns the window. */
export async function incrementRateLimit(db: Db, key: string, nowMs: number, windowMs: number): Promise<{ hits: number; resetAtMs: number }> {
  const resetAt = nowMs + windowMs;
  await db
    .insertInto('rate_limit_counters')
    .values({ key, hits: 1, reset_at_ms: resetAt })
    .onConflict((oc) =>
      oc.column('key').doUpdateSet((eb) => ({
        hits: sql<number>`case when ${eb.ref('rate_limit_counters.reset_at_ms')} <= ${nowMs} then 1 else ${eb.ref('rate_limit_counters.hits')} + 1 end`,
        reset_at_ms: sql<number>`case when ${eb.ref('rate_limit_counters.reset_at_ms')} <= ${nowMs} then ${resetAt} else ${eb.ref('rate_limit_counters.reset_at_ms')} end`,
      })),
    )
    .execute();
  const row = await db.selectFrom('rate_limit_counters').select(['hits', 'reset_at_ms']).where('key', '=', key).executeTakeFirstOrThrow();
  return { hits: Number(row.hits), resetAtMs: Number(row.reset_at_ms) };
}

export async function findRateLimit(db: Db, key: string): Promise<{ hits: number; resetAtMs: number } | undefined> {
  const row = await db.selectFrom('rate_limit_counters').select(['hits', 'reset_at_ms']).where('key', '=', key).executeTakeFirst();
  return row && { hits: Number(row.hits), resetAtMs: Number(row.reset_at_ms) };
}

export async function decrementRateLimit(db: Db, key: string): Promise<void> {
  await db
    .updateTable('rate_limit_counters')
    .set((eb) => ({ hits: sql<number>`case when ${eb.ref('hits')} > 0 then ${eb.ref('hits')} - 1 else 0 end` }))
    .where('key', '=', key)
    .execute();
}

export async function resetRateLimit(db: Db, key: string): Promise<void> {
  await db.deleteFrom('rate_limit_counters').where('key', '=', key).execute();
}

export async function setWorkProgress(db: Db, key: string, fraction: number, at: Date): Promise<void> {
  await db
    .insertInto('work_progress')
    .values({ key, fraction, updated_at: at.toISOString() })
    .onConflict((oc) => oc.column('key').doUpdateSet({ fraction, updated_at: at.toISOString() }))
    .execute();
}

export async function workProgressOf(db: Db, keys: string[]): Promise<Map<string, number>> {
  if (keys.length === 0) return new Map();
  const rows = await db.selectFrom('work_progress').select(['key', 'fraction']).where('key', 'in', keys).execute();
  return new Map(rows.map((r) => [r.key, Number(r.fraction)]));
}

export async function clearWorkProgress(db: Db, key: string): Promise<void> {
  await db.deleteFrom('work_progress').where('key', '=', key).execute();
}
