import type { ShopRole } from '@revloop/domain/auth';
import type { Db } from '../client';
import type {
  InsertableMembershipRow,
  InsertableUserRow,
  MembershipRow,
  UpdateableUserRow,
  UserRow,
} from './user.table';

export async function findUserByEmail(db: Db, email: string): Promise<UserRow | undefined> {
  return db.selectFrom('users').selectAll().where('email', '=', email.toLowerCase()).executeTakeFirst();
}

export async function findUserById(db: Db, id: string): Promise<UserRow | undefined> {
  return db.selectFrom('users').selectAll().where('id', '=', id).executeTakeFirst();
}

export async function insertUser(db: Db, row: InsertableUserRow): Promise<UserRow> {
  return db
    .insertInto('users')
    .values({ ...row, email: row.email.toLowerCase() })
    .returningAll()
    .executeTakeFirstOrThrow();
}

export async function updateUser(db: Db, id: string, patch: UpdateableUserRow): Promise<UserRow | undefined> {
  return db.updateTable('users').set(patch).where('id', '=', id).returningAll().executeTakeFirst();
}

/** The membership a user signs in to: their oldest active one. */
export async function findSignInMembership(db: Db, userId: string): Promise<MembershipRow | undefined> {
  return db
    .selectFrom('memberships')
    .selectAll()
    .where('user_id', '=', userId)
    .where('status', '=', 'active')
    .orderBy('created_at')
    .executeTakeFirst();
}

export async function findMembershipOfUser(db: Db, shopId: string, userId: string): Promise<MembershipRow | undefined> {
  return db
    .selectFrom('memberships')
    .selectAll()
    .where('shop_id', '=', shopId)
    .where('user_id', '=', userId)
    .executeTakeFirst();
}

export async function findMembership(db: Db, shopId: string, id: string): Promise<MembershipRow | undefined> {
  return db.selectFrom('memberships').selectAll().where('shop_id', '=', shopId).where('id', '=', id).executeTakeFirst();
}

export async function insertMembership(db: Db, row: InsertableMembershipRow): Promise<MembershipRow> {
  return db.insertInto('memberships').values(row).returningAll().executeTakeFirstOrThrow();
}

export interface MemberListRow extends MembershipRow {
  name: string;
  email: string;
  last_sign_in_at: string | null;
  dealer_name: string | null;
}

export async function listMembers(
  db: Db,
  shopId: string,
  filter: { role?: ShopRole; roles?: readonly ShopRole[]; dealerId?: string } = {},
): Promise<MemberListRow[]> {
  let query = db
    .selectFrom('memberships')
    .innerJoin('users', 'users.id', 'memberships.user_id')
    .leftJoin('dealers', 'dealers.id', 'memberships.dealer_id')
    .selectAll('memberships')
    .select(['users.name', 'users.email', 'users.last_sign_in_at', 'dealers.name as dealer_name'])
    .where('memberships.shop_id', '=', shopId);
  if (filter.role) query = query.where('memberships.role', '=', filter.role);
  if (filter.roles) query = query.where('memberships.role', 'in', filter.roles);
  if (filter.dealerId) query = query.where('memberships.dealer_id', '=', filter.dealerId);
  return query.orderBy('users.name').execute();
}

export async function updateMembership(
  db: Db,
  shopId: string,
  id: string,
  patch: Partial<Pick<MembershipRow, 'role' | 'status' | 'dealer_id'>>,
): Promise<MembershipRow | undefined> {
  return db
    .updateTable('memberships')
    .set(patch)
    .where('shop_id', '=', shopId)
    .where('id', '=', id)
    .returningAll()
    .executeTakeFirst();
}

export async function countActiveOwners(db: Db, shopId: string): Promise<number> {
  const row = await db
    .selectFrom('memberships')
    .select((eb) => eb.fn.countAll<number>().as('n'))
    .where('shop_id', '=', shopId)
    .where('role', '=', 'owner')
    .where('status', '=', 'active')
    .executeTakeFirstOrThrow();
  return Number(row.n);
}

export async function insertPasswordReset(
  db: Db,
  row: { token_hash: string; user_id: string; created_at: string; expires_at: string },
): Promise<void> {
  await db.insertInto('password_resets').values({ ...row, used_at: null }).execute();
}

/** Ends every reset link of a user still open, so only the newest one sent (or none, once one is used) works. */
export async function endPasswordResets(db: Db, userId: string, now: string): Promise<void> {
  await db.updateTable('password_resets').set({ used_at: now }).where('user_id', '=', userId).where('used_at', 'is', null).execute();
}

/** Marks a live reset token used and returns its user, in one statement so a token works once. */
export async function consumePasswordReset(db: Db, tokenHash: string, now: string): Promise<string | undefined> {
  const row = await db
    .updateTable('password_resets')
    .set({ used_at: now })
    .where('token_hash', '=', tokenHash)
    .where('used_at', 'is', null)
    .where('expires_at', '>', now)
    .returning('user_id')
    .executeTakeFirst();
  return row?.user_id;
}
