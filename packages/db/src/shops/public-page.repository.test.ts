import { describe, expect, it } from 'vitest';
import { newId, nowIso } from '../ids';
import { insertPackage } from '../packages/package.repository';
import { twoShops } from '../testing/two-shops';
import { insertMembership, insertUser } from '../users/user.repository';
import { consumePublicSignUp, insertPublicSignUp } from './public-sign-up.repository';
import { findPublicShopBySlug, isSlugTaken, shopSetupFacts, updateShop } from './shop.repository';

describe('public pages and the setup checklist', () => {
  it('finds a shop by slug only while its page is on and the shop active; slugs are unique', async () => {
    const { db, shopA, shopB } = await twoShops();
    expect(await findPublicShopBySlug(db, 'shop-a')).toBeUndefined();
    await updateShop(db, shopA, { slug: 'shop-a' });
    expect(await findPublicShopBySlug(db, 'shop-a')).toBeUndefined();
    await updateShop(db, shopA, { public_page: 1 });
    expect((await findPublicShopBySlug(db, 'shop-a'))?.id).toBe(shopA);
    await updateShop(db, shopA, { status: 'suspended' });
    expect(await findPublicShopBySlug(db, 'shop-a')).toBeUndefined();
    expect(await isSlugTaken(db, 'shop-a', shopB)).toBe(true);
    expect(await isSlugTaken(db, 'shop-a', shopA)).toBe(false);
    await expect(updateShop(db, shopB, { slug: 'shop-a' })).rejects.toThrow(/unique constraint/i);
    // Shops without an address do not clash.
    expect((await db.selectFrom('shops').select('id').where('slug', 'is', null).execute()).length).toBe(1);
  });

  it('counts only the shop’s own packages, tuners and invitations', async () => {
    const { db, shopA, shopB } = await twoShops();
    const at = nowIso();
    await insertPackage(db, { id: newId(), shop_id: shopB, name: 'Stage', modules: '["ECM"]', retail_price_minor: 100, dealer_price_minor: 80, rounds_included: 3, created_at: at });
    const tuner = await insertUser(db, { id: newId(), email: 't@example.test', name: 'T', created_at: at });
    await insertMembership(db, { id: newId(), shop_id: shopB, user_id: tuner.id, role: 'tuner', created_at: at });
    expect(await shopSetupFacts(db, shopA, at)).toEqual({ activePackages: 0, tunersInvited: 0, subscriptionStatus: null });
    expect(await shopSetupFacts(db, shopB, at)).toEqual({ activePackages: 1, tunersInvited: 1, subscriptionStatus: null });
  });

  it('a sign-up link is spent once and not after it expires', async () => {
    const { db, shopA } = await twoShops();
    const row = { shop_id: shopA, email: 'x@example.test', name: 'X', password_hash: 'h', intake: '{}', created_at: '2026-12-01T00:00:00.000Z', expires_at: '2026-12-02T00:00:00.000Z', used_at: null };
    await insertPublicSignUp(db, { ...row, token_hash: 'a' });
    await insertPublicSignUp(db, { ...row, token_hash: 'b' });
    expect((await consumePublicSignUp(db, 'a', '2026-12-01T12:00:00.000Z'))?.email).toBe('x@example.test');
    expect(await consumePublicSignUp(db, 'a', '2026-12-01T12:00:01.000Z')).toBeUndefined();
    expect(await consumePublicSignUp(db, 'b', '2026-12-02T00:00:00.000Z')).toBeUndefined();
  });
});
