import { insertShop, newId, setShopStatus, type ShopRow, type ShopStatus } from '@revloop/db';
import type { AppDeps } from '../../context';
import type { AuthContext } from '../../http/auth-context';
import { writeWithAudit } from '../audit/audit.service';
import { writeInvitation } from '../invitations/invitation.service';

export interface NewShop {
  name: string;
  ownerName: string;
  ownerEmail: string;
  currency?: string;
}

/** Opens a shop, invites its first owner, and audits it. */
export async function createShop({ db, clock, env, mailer }: AppDeps, auth: AuthContext, input: NewShop): Promise<ShopRow> {
  const { shop, mail } = await writeWithAudit(
    db,
    async (trx) => {
      const shop = await insertShop(trx, {
        id: newId(),
        name: input.name,
        currency: input.currency ?? 'USD',
        created_at: clock.now().toISOString(),
      });
      const { mail } = await writeInvitation(trx, env.APP_ORIGIN, { shopId: shop.id, email: input.ownerEmail, role: 'owner', invitedBy: null }, clock.now());
      return { shop, mail };
    },
    ({ shop }) => ({
      shopId: shop.id,
      actorUserId: auth.user.id,
      action: 'shop.created',
      subjectType: 'Shop',
      subjectId: shop.id,
      details: { ownerEmail: input.ownerEmail, ownerName: input.ownerName },
      at: clock.now(),
    }),
  );
  await mailer.send(mail);
  return shop;
}

/** Suspends or reactivates a shop, and audits it. */
export async function changeShopStatus({ db, clock }: AppDeps, auth: AuthContext, shopId: string, status: ShopStatus): Promise<ShopRow | undefined> {
  return writeWithAudit(
    db,
    (trx) => setShopStatus(trx, shopId, status, clock.now().toISOString()),
    () => ({ shopId, actorUserId: auth.user.id, action: `shop.${status}`, subjectType: 'Shop', subjectId: shopId, at: clock.now() }),
  );
}
