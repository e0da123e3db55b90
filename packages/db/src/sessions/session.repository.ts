import { sql } from 'kysely';
import type { ShopSubscriptionRow } from '../billing/billing.table';
import type { Db } from '../client';
import { columnsOf } from '../sql-functions';
import type { ShopRow } from '../shops/shop.table';
import type { MembershipRow, UserRow } from '../users/user.table';
import type { SessionRow } from './session.table';

export async function insertSession(db: Db, row: SessionRow): Promise<void> {
  await db.insertInto('sessions').values(row).execute();
}

export async function findSession(db: Db, id: string): Promise<SessionRow | undefined> {
  return db.selectFrom('sessions').selectAll().where('id', '=', id).executeTakeFirst();
}

export async function extendSession(db: Db, id: string, expiresAt: number): Promise<void> {
  await db.updateTable('sessions').set({ expires_at: expiresAt }).where('id', '=', id).execute();
}

export async function deleteSession(db: Db, id: string): Promise<void> {
  await db.deleteFrom('sessions').where('id', '=', id).execute();
}

export async function deleteUserSessions(db: Db, userId: string, shopId?: string): Promise<void> {
  let query = db.deleteFrom('sessions').where('user_id', '=', userId);
  if (shopId) query = query.where('shop_id', '=', shopId);
  await query.execute();
}

export async function deleteExpiredSessions(db: Db, now: number): Promise<void> {
  await db.deleteFrom('sessions').where((eb) => eb.or([eb('expires_at', '<=', now), eb('absolute_expires_at', '<=', now)])).execute();
}

export interface SessionContextRows {
  session: SessionRow;
  user: UserRow;
  membership: MembershipRow | null;
  shop: ShopRow | null;
  billing: ShopSubscriptionRow | null;
}

const CONTEXT_TABLES = { session: 'sessions', user: 'users', membership: 'memberships', shop: 'shops', billing: 'shop_subscriptions' } as const;
const contextSelects = new WeakMap<Db, Promise<string>>();

/** Every column of the five tables, each named `<part>.<column>`, read once per database from the schema. */
function contextSelect(db: Db): Promise<string> {
  let select = contextSelects.get(db);
  if (!select) {
    select = Promise.all(
      Object.entries(CONTEXT_TABLES).map(async ([part, table]) => {
        const columns = await columnsOf(db, table);
        return columns.map((c) => `"${part}"."${c}" as "${part}.${c}"`);
      }),
    ).then((parts) => parts.flat().join(', '));
    contextSelects.set(db, select);
  }
  return select;
}

/**
 * The session with its user, and for a shop session the member's row, the shop and its subscription, in one query:
 * the session check runs on every request, so it is one indexed read rather than five.
 */
export async function findSessionContext(db: Db, id: string): Promise<SessionContextRows | undefined> {
  const { rows } = await sql<Record<string, unknown>>`select ${sql.raw(await contextSelect(db))}
    from sessions as session
    join users as "user" on "user".id = session.user_id
    left join memberships as membership on membership.shop_id = session.shop_id and membership.user_id = session.user_id
    left join shops as shop on shop.id = session.shop_id
    left join shop_subscriptions as billing on billing.shop_id = session.shop_id
    where session.id = ${id}`.execute(db);
  const row = rows[0];
  if (!row) return undefined;
  const parts: Record<string, Record<string, unknown>> = { session: {}, user: {}, membership: {}, shop: {}, billing: {} };
  for (const [name, value] of Object.entries(row)) {
    const dot = name.indexOf('.');
    parts[name.slice(0, dot)]![name.slice(dot + 1)] = value;
  }
  // A left join that found nothing gives all nulls; a real row has at least its key.
  const present = (part: string) => Object.values(parts[part]!).some((v) => v !== null);
  return {
    session: parts.session as unknown as SessionRow,
    user: parts.user as unknown as UserRow,
    membership: present('membership') ? (parts.membership as unknown as MembershipRow) : null,
    shop: present('shop') ? (parts.shop as unknown as ShopRow) : null,
    billing: present('billing') ? (parts.billing as unknown as ShopSubscriptionRow) : null,
  };
}
