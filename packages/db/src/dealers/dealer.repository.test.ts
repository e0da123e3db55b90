import { describe, expect, it } from 'vitest';
import { newId, nowIso } from '../ids';
import { twoShops } from '../testing/two-shops';
import { findDealer, insertDealer, listDealers } from './dealer.repository';

describe('dealer repository', () => {
  it('reads another shop’s dealer as undefined', async () => {
    const { db, shopA, shopB } = await twoShops();
    const dealer = await insertDealer(db, {
      id: newId(),
      shop_id: shopB,
      name: 'Other garage',
      contact_name: 'X',
      contact_email: 'x@example.test',
      created_at: nowIso(),
    });
    expect(await findDealer(db, shopA, dealer.id)).toBeUndefined();
    expect(await listDealers(db, shopA)).toEqual([]);
    expect((await findDealer(db, shopB, dealer.id))?.name).toBe('Other garage');
  });
});
