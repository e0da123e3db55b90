import { insertShop, newId, setShopStatus, type ShopRow, type ShopStatus } from '@revloop/db';
import type { AppDeps } from '../../context';
import type { AuthContext } from '../../http/auth-context';
import { recordAudit } from '../audit/audit.service';
import { createInvitation } from '../invitations/invitation.service';

export interface NewShop {
  name: string;
  ownerName: string;
  ownerEmail: string;
  currency?: string;
}

/** Opens a shop, invites its first owner, and audits it. */
export async function createShop({ db, clock, env, mailer }: AppDeps, auth: AuthContext, input: NewShop): Promise<ShopRow> {
  const shop = await insertShop(db, {
    id: newId(),
    name: input.name,
    currency: input.currency ?? 'USD',
    created_at: clock.now().toISOString(),
  });
  await createInvitation(db, mailer, env.APP_ORIGIN, { shopId: shop.id, email: input.ownerEmail, role: 'owner', invitedBy: null }, clock.now());
  await recordAudit(db, {
    shopId: shop.id,
    actorUserId: auth.user.id,
    action: 'shop.created',
    subjectType: 'Shop',
    subjectId: shop.id,
    details: { ownerEmail: input.ownerEmail, ownerName: input.ownerName },
    at: clock.now(),
  });
  return shop;
}

/** Suspends or reactivates a shop, and audits it. */
export async function changeShopStatus({ db, clock }: AppDeps, auth: AuthContext, shopId: string, status: ShopStatus): Promise<ShopRow | undefined> {
  const updated = await setShopStatus(db, shopId, status, clock.now().toISOString());
  await recordAudit(db, { shopId, actorUserId: auth.user.id, action: `shop.${status}`, subjectType: 'Shop', subjectId: shopId, at: clock.now() });
  return updated;
}
