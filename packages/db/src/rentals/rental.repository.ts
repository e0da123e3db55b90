import { sql } from 'kysely';
import type { RentalScopeKind as RentalScope } from '@revloop/domain/auth';
import { BLOCKING_STATES, KIT_AWAY_STATES, type RentalState } from '@revloop/domain/rentals';
import { dialectOf, type Db } from '../client';
import { sqlFalse } from '../sql-functions';
import type {
  InsertableKitRow,
  InsertableRentalEntryRow,
  InsertableRentalRow,
  KitRow,
  RentalEntryRow,
  RentalRow,
  UpdateableKitRow,
  UpdateableRentalRow,
} from './rental.table';

/** Which rentals a viewer may list (from rentalScopeFor in ability.ts). */
export type { RentalScope };

/**
 * Runs `fn` in one write transaction that no other writer can interleave with, so no other connection can write
 * between a check and the insert that depends on it. SQLite: BEGIN IMMEDIATE takes the database's write lock at the
 * start (Kysely's single connection runs nothing else meanwhile). PostgreSQL: a transaction-scoped advisory lock that
 * every such transaction takes first, on any instance, so they run one at a time.
 */
export async function inWriteTransaction<T>(db: Db, fn: (trx: Db) => Promise<T>): Promise<T> {
  if (dialectOf(db) === 'postgres') {
    return db.transaction().execute(async (trx) => {
      await sql`select pg_advisory_xact_lock(${WRITE_LOCK})`.execute(trx);
      return fn(trx);
    });
  }
  return db.connection().execute(async (conn) => {
    await sql`begin immediate`.execute(conn);
    try {
      const result = await fn(conn);
      await sql`commit`.execute(conn);
      return result;
    } catch (error) {
      await sql`rollback`.execute(conn);
      throw error;
    }
  });
}

/** The advisory lock key of inWriteTransaction on PostgreSQL (any fixed 64-bit number; this one spells "rvlp"). */
const WRITE_LOCK = 0x72766c70;

// ---------- kits ----------

export async function insertKit(db: Db, row: InsertableKitRow): Promise<KitRow> {
  return db.insertInto('kits').values(row).returningAll().executeTakeFirstOrThrow();
}

export async function findKit(db: Db, shopId: string, id: string): Promise<KitRow | undefined> {
  return db.selectFrom('kits').selectAll().where('shop_id', '=', shopId).where('id', '=', id).executeTakeFirst();
}

export async function listKits(db: Db, shopId: string, opts: { includeRetired: boolean }): Promise<KitRow[]> {
  let query = db.selectFrom('kits').selectAll().where('shop_id', '=', shopId);
  if (!opts.includeRetired) query = query.where('status', '!=', 'retired');
  return query.orderBy('name').orderBy('id').execute();
}

export async function updateKit(db: Db, shopId: string, id: string, patch: UpdateableKitRow): Promise<KitRow | undefined> {
  return db.updateTable('kits').set(patch).where('shop_id', '=', shopId).where('id', '=', id).returningAll().executeTakeFirst();
}

// ---------- rentals ----------

export interface RentalListRow extends RentalRow {
  kit_name: string | null;
  customer_name: string;
  job_number: number;
}

function withNames(db: Db, shopId: string, scope: RentalScope) {
  let query = db
    .selectFrom('rentals')
    .innerJoin('users', 'users.id', 'rentals.customer_user_id')
    .innerJoin('jobs', 'jobs.id', 'rentals.job_id')
    .leftJoin('kits', 'kits.id', 'rentals.kit_id')
    .selectAll('rentals')
    .select(['kits.name as kit_name', 'users.name as customer_name', 'jobs.number as job_number'])
    .where('rentals.shop_id', '=', shopId);
  if (scope.kind === 'none') query = query.where(sqlFalse);
  if (scope.kind === 'customer') query = query.where('rentals.customer_user_id', '=', scope.userId);
  if (scope.kind === 'dealer') query = query.where('rentals.dealer_id', '=', scope.dealerId);
  return query;
}

export async function findRental(db: Db, shopId: string, id: string, scope: RentalScope = { kind: 'shop' }): Promise<RentalListRow | undefined> {
  return withNames(db, shopId, scope).where('rentals.id', '=', id).executeTakeFirst();
}

export interface RentalFilter {
  jobId?: string;
  kitId?: string;
  state?: RentalState;
  states?: readonly RentalState[];
}

export async function listRentals(db: Db, shopId: string, scope: RentalScope, filter: RentalFilter = {}): Promise<RentalListRow[]> {
  let query = withNames(db, shopId, scope);
  if (filter.jobId) query = query.where('rentals.job_id', '=', filter.jobId);
  if (filter.kitId) query = query.where('rentals.kit_id', '=', filter.kitId);
  if (filter.state) query = query.where('rentals.state', '=', filter.state);
  if (filter.states) query = query.where('rentals.state', 'in', [...filter.states]);
  return query.orderBy('rentals.start_date').orderBy('rentals.id').execute();
}

/** Bookings of the kit that hold any day of from..to (inclusive), other than `exceptId`. */
export async function findKitClashes(db: Db, shopId: string, kitId: string, from: string, to: string, exceptId?: string): Promise<RentalListRow[]> {
  let query = withNames(db, shopId, { kind: 'shop' })
    .where('rentals.kit_id', '=', kitId)
    .where('rentals.state', 'in', [...BLOCKING_STATES])
    .where('rentals.blocked_from', '<=', to)
    .where('rentals.blocked_to', '>=', from);
  if (exceptId) query = query.where('rentals.id', '!=', exceptId);
  return query.orderBy('rentals.blocked_from').execute();
}

export async function insertRental(db: Db, row: InsertableRentalRow): Promise<RentalRow> {
  return db.insertInto('rentals').values(row).returningAll().executeTakeFirstOrThrow();
}

/** Updates the rental only while it is still in `fromState`; undefined when it moved under us. */
export async function updateRental(db: Db, shopId: string, id: string, patch: UpdateableRentalRow, fromState?: RentalState): Promise<RentalRow | undefined> {
  let query = db.updateTable('rentals').set(patch).where('shop_id', '=', shopId).where('id', '=', id);
  if (fromState) query = query.where('state', '=', fromState);
  return query.returningAll().executeTakeFirst();
}

/** Webhooks name only the provider's object: these map it back to its rental (platform-level, no session). */
export async function findRentalByCheckoutSession(db: Db, sessionId: string): Promise<RentalRow | undefined> {
  return db
    .selectFrom('rentals')
    .selectAll()
    .where((eb) => eb.or([eb('fee_checkout_session_id', '=', sessionId), eb('setup_checkout_session_id', '=', sessionId)]))
    .executeTakeFirst();
}

export async function findRentalByHoldIntent(db: Db, intentId: string): Promise<RentalRow | undefined> {
  return db.selectFrom('rentals').selectAll().where('hold_intent_id', '=', intentId).executeTakeFirst();
}

/** Rentals with the kit away, in every shop: the reminder and hold sweep walks them. */
export async function listAwayRentals(db: Db): Promise<RentalRow[]> {
  return db.selectFrom('rentals').selectAll().where('state', 'in', [...KIT_AWAY_STATES]).orderBy('shop_id').orderBy('due_date').execute();
}

// ---------- money lines and reminders ----------

/** Adds a money line; false when one with the same provider_ref exists (a replayed webhook). */
export async function insertRentalEntry(db: Db, row: InsertableRentalEntryRow): Promise<boolean> {
  const result = await db.insertInto('rental_entries').values(row).onConflict((oc) => oc.column('provider_ref').doNothing()).executeTakeFirst();
  return Number(result.numInsertedOrUpdatedRows ?? 0n) === 1;
}

export async function listRentalEntries(db: Db, shopId: string, rentalId: string): Promise<RentalEntryRow[]> {
  return db.selectFrom('rental_entries').selectAll().where('shop_id', '=', shopId).where('rental_id', '=', rentalId).orderBy('at').orderBy('id').execute();
}

/** Money lines of the shop's rentals within from..to (ISO instants), for the overview's revenue. */
export async function listShopRentalEntries(db: Db, shopId: string, fromIso: string, toIso: string): Promise<(RentalEntryRow & { kit_id: string | null })[]> {
  return db
    .selectFrom('rental_entries')
    .innerJoin('rentals', 'rentals.id', 'rental_entries.rental_id')
    .selectAll('rental_entries')
    .select('rentals.kit_id')
    .where('rental_entries.shop_id', '=', shopId)
    .where('rental_entries.at', '>=', fromIso)
    .where('rental_entries.at', '<', toIso)
    .execute();
}

export interface RentalMoneyRow extends RentalEntryRow {
  job_number: number;
  customer_name: string;
  kit_name: string | null;
  currency: string;
}

/** Every money line of the shop's rentals with an instant in fromIso..toIso (end exclusive), oldest first. */
export async function listRentalMoney(db: Db, shopId: string, fromIso: string, toIso: string): Promise<RentalMoneyRow[]> {
  return db
    .selectFrom('rental_entries')
    .innerJoin('rentals', 'rentals.id', 'rental_entries.rental_id')
    .innerJoin('users', 'users.id', 'rentals.customer_user_id')
    .innerJoin('jobs', 'jobs.id', 'rentals.job_id')
    .leftJoin('kits', 'kits.id', 'rentals.kit_id')
    .selectAll('rental_entries')
    .select(['jobs.number as job_number', 'users.name as customer_name', 'kits.name as kit_name', 'rentals.currency'])
    .where('rental_entries.shop_id', '=', shopId)
    .where('rentals.shop_id', '=', shopId)
    .where('rental_entries.at', '>=', fromIso)
    .where('rental_entries.at', '<', toIso)
    .orderBy('rental_entries.at')
    .orderBy('rental_entries.id')
    .execute();
}

/** Claims a reminder; false when it was already sent, so the sweep never sends it twice. */
export async function claimRentalReminder(db: Db, row: { rental_id: string; kind: string; day: string; shop_id: string; sent_at: string }): Promise<boolean> {
  const result = await db.insertInto('rental_reminders').values(row).onConflict((oc) => oc.doNothing()).executeTakeFirst();
  return Number(result.numInsertedOrUpdatedRows ?? 0n) === 1;
}

export async function countRentalReminders(db: Db, shopId: string, rentalId: string, kind: string): Promise<number> {
  const row = await db
    .selectFrom('rental_reminders')
    .select((eb) => eb.fn.countAll<number>().as('n'))
    .where('shop_id', '=', shopId)
    .where('rental_id', '=', rentalId)
    .where('kind', '=', kind)
    .executeTakeFirstOrThrow();
  return Number(row.n);
}

export type BookingResult = { ok: true; rental: RentalRow } | { ok: false; clashes: RentalListRow[] };

/**
 * Inserts a booked rental unless another booking of the kit holds any of its blocked days. The check and the insert
 * share one write transaction, so of two bookings racing for the same days exactly one is written.
 */
export async function insertRentalIfFree(
  db: Db,
  row: InsertableRentalRow & { kit_id: string },
  then: (trx: Db, rental: RentalRow) => Promise<void> = async () => {},
): Promise<BookingResult> {
  return inWriteTransaction(db, async (trx) => {
    const clashes = await findKitClashes(trx, row.shop_id, row.kit_id, row.blocked_from, row.blocked_to);
    if (clashes.length > 0) return { ok: false, clashes };
    const rental = await insertRental(trx, row);
    await then(trx, rental);
    return { ok: true, rental };
  });
}

/** Books a requested rental onto a kit under the same rule as insertRentalIfFree; undefined rental if it moved. */
export async function bookRequestedRentalIfFree(
  db: Db,
  shopId: string,
  id: string,
  patch: UpdateableRentalRow & { kit_id: string; blocked_from: string; blocked_to: string },
  then: (trx: Db, rental: RentalRow) => Promise<void>,
): Promise<BookingResult | undefined> {
  return inWriteTransaction(db, async (trx) => {
    const clashes = await findKitClashes(trx, shopId, patch.kit_id, patch.blocked_from, patch.blocked_to, id);
    if (clashes.length > 0) return { ok: false, clashes };
    const rental = await updateRental(trx, shopId, id, patch, 'requested');
    if (!rental) return undefined;
    await then(trx, rental);
    return { ok: true, rental };
  });
}
