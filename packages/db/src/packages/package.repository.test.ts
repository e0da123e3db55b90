import { describe, expect, it } from 'vitest';
import { newId, nowIso } from '../ids';
import { twoShops } from '../testing/two-shops';
import { findPackage, insertPackage, listPackages, updatePackage } from './package.repository';

describe('package repository', () => {
  it('never reads, lists or changes another shop’s package', async () => {
    const { db, shopA, shopB } = await twoShops();
    const pkg = await insertPackage(db, { id: newId(), shop_id: shopB, name: 'Stage', modules: '["ECM"]', retail_price_minor: 100, dealer_price_minor: 80, rounds_included: 3, created_at: nowIso() });
    expect(await findPackage(db, shopA, pkg.id)).toBeUndefined();
    expect(await listPackages(db, shopA)).toEqual([]);
    expect(await updatePackage(db, shopA, pkg.id, { active: 0 })).toBeUndefined();
    expect((await findPackage(db, shopB, pkg.id))?.active).toBe(1);
  });

  it('refuses a dealer price above the retail price (schema check)', async () => {
    const { db, shopA } = await twoShops();
    await expect(
      insertPackage(db, { id: newId(), shop_id: shopA, name: 'Bad', modules: '["ECM"]', retail_price_minor: 100, dealer_price_minor: 120, rounds_included: 1, created_at: nowIso() }),
    ).rejects.toThrow(/check constraint/i);
  });
});
