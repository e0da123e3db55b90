import {
  consumePasswordReset,
  endPasswordResets,
  findSignInMembership,
  findUserByEmail,
  insertMembership,
  insertPasswordReset,
  insertShop,
  insertUser,
  newId,
  updateUser,
  type Db,
  type UserRow,
} from '@revloop/db';
import { DomainError } from '@revloop/domain';
import type { AppDeps } from '../../context';
import { writeWithAudit } from '../audit/audit.service';
import { hashPassword } from './password';
import { generateToken, hashToken, invalidateUserSessions } from './session.service';

const RESET_TTL_MS = 60 * 60_000;

/** Opens a shop with its first owner, and audits it. */
export async function signUpShop(
  { db, clock }: AppDeps,
  input: { shopName: string; name: string; email: string; password: string },
): Promise<{ user: UserRow; shopId: string }> {
  if (await findUserByEmail(db, input.email)) {
    throw new DomainError('conflict', 'An account with this e-mail already exists. Sign in instead.');
  }
  const passwordHash = await hashPassword(input.password);
  const at = clock.now().toISOString();
  return writeWithAudit(
    db,
    async (trx) => {
      const shop = await insertShop(trx, { id: newId(), name: input.shopName, created_at: at });
      const user = await insertUser(trx, {
        id: newId(),
        email: input.email,
        name: input.name,
        password_hash: passwordHash,
        created_at: at,
      });
      await insertMembership(trx, { id: newId(), shop_id: shop.id, user_id: user.id, role: 'owner', created_at: at });
      return { user, shopId: shop.id };
    },
    (signedUp) => ({ shopId: signedUp.shopId, actorUserId: signedUp.user.id, action: 'shop.created', subjectType: 'Shop', subjectId: signedUp.shopId, at: clock.now() }),
  );
}

/** The shop a user signs in to: none for platform admins, else their oldest active membership. */
export async function signInShopId(db: Db, user: UserRow): Promise<string | null> {
  if (user.platform_admin === 1) return null;
  const membership = await findSignInMembership(db, user.id);
  if (!membership) throw new DomainError('forbidden', 'This account has no active shop membership. Ask the shop owner.');
  return membership.shop_id;
}

/** Notes when the user last signed in. */
export async function markSignedIn(db: Db, userId: string, now: Date): Promise<void> {
  await updateUser(db, userId, { last_sign_in_at: now.toISOString() });
}

/** Returns the token to mail, or null when there is no such account (the caller answers the same either way). */
export async function startPasswordReset(db: Db, email: string, now: Date): Promise<{ token: string; user: UserRow; expiresAt: Date } | null> {
  const user = await findUserByEmail(db, email);
  if (!user || !user.password_hash) return null;
  const token = generateToken();
  const expiresAt = new Date(now.getTime() + RESET_TTL_MS);
  await db.transaction().execute(async (trx) => {
    await endPasswordResets(trx, user.id, now.toISOString());
    await insertPasswordReset(trx, {
      token_hash: hashToken(token),
      user_id: user.id,
      created_at: now.toISOString(),
      expires_at: expiresAt.toISOString(),
    });
  });
  return { token, user, expiresAt };
}

/** Sets the new password and ends every session and every other reset link of the account. */
export async function finishPasswordReset(db: Db, token: string, password: string, now: Date): Promise<string> {
  // One transaction, so two links of the same account used at once cannot both get through.
  const userId = await db.transaction().execute(async (trx) => {
    const owner = await consumePasswordReset(trx, hashToken(token), now.toISOString());
    if (owner) await endPasswordResets(trx, owner, now.toISOString());
    return owner;
  });
  if (!userId) throw new DomainError('validation', 'This reset link is invalid, used or expired. Ask for a new one.');
  await updateUser(db, userId, { password_hash: await hashPassword(password) });
  await invalidateUserSessions(db, userId);
  return userId;
}
