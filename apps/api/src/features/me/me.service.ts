import type { Me } from '@revloop/contract';
import { findDealer, updateUser, type Db } from '@revloop/db';
import type { AuthContext } from '../../http/auth-context';

/** The `/api/me` shape: who is signed in, in which shop and role, and the actor the web builds its ability from. */
export async function toMe(db: Db, auth: AuthContext): Promise<Me> {
  const { user, shop, membership, actor } = auth;
  const dealer = shop && membership?.dealer_id ? await findDealer(db, shop.id, membership.dealer_id) : undefined;
  return {
    user: { id: user.id, email: user.email, name: user.name, unitSystem: user.unit_system },
    role: actor.platformAdmin ? 'platform_admin' : (actor.role ?? null),
    platformAdmin: actor.platformAdmin,
    shop: shop
      ? { id: shop.id, name: shop.name, status: shop.status, readOnly: actor.shopReadOnly, readOnlyReason: auth.readOnlyReason, currency: shop.currency }
      : null,
    dealer: dealer ? { id: dealer.id, name: dealer.name } : null,
    actor,
  };
}

/** Saves the signed-in user's own name and unit system; what is left out stays. */
export async function updateMe(db: Db, userId: string, input: { name?: string; unitSystem?: 'metric' | 'imperial' }): Promise<void> {
  await updateUser(db, userId, {
    ...(input.name !== undefined && { name: input.name }),
    ...(input.unitSystem !== undefined && { unit_system: input.unitSystem }),
  });
}
