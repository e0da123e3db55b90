import { shopSetupFacts, type Db, type ShopRow } from '@revloop/db';
import type { ShopSetup, ShopSetupItem } from '@revloop/contract';
import { parseShopSettings } from '@revloop/domain/shops';

// A plan counts as chosen once the shop pays for one; the trial every new shop starts with is not a choice.
const CHOSEN = new Set(['active', 'past_due', 'unpaid']);

/** The first-run checklist, derived from the shop's data each time (no stored ticks to drift). */
export async function shopSetup(db: Db, shop: ShopRow, now: Date): Promise<ShopSetup> {
  const facts = await shopSetupFacts(db, shop.id, now.toISOString());
  const done: Record<ShopSetupItem, boolean> = {
    package: facts.activePackages > 0,
    log_requests: Object.keys(parseShopSettings(shop.settings).logRequestDefaults).length > 0,
    tuner: facts.tunersInvited > 0,
    plan: facts.subscriptionStatus !== null && CHOSEN.has(facts.subscriptionStatus),
    public_page: shop.slug !== null && shop.public_page === 1,
  };
  const items = (Object.keys(done) as ShopSetupItem[]).map((id) => ({ id, done: done[id] }));
  return { items, done: items.every((i) => i.done), slug: shop.slug };
}
