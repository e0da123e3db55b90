import { describe, expect, it } from 'vitest';
import { newId, nowIso } from '../ids';
import { jobIn, twoShops } from '../testing/two-shops';
import type { Db } from '../client';
import {
  claimRentalReminder,
  findKit,
  findRental,
  insertKit,
  insertRentalEntry,
  insertRentalIfFree,
  listKits,
  listRentals,
  updateKit,
  updateRental,
} from './rental.repository';

async function kitIn(db: Db, shopId: string) {
  const at = nowIso();
  return insertKit(db, { id: newId(), shop_id: shopId, name: 'Kit 1', interface_serial: 'SN-1', status: 'available', weekly_price_minor: 9000, deposit_minor: 30000, late_fee_per_day_minor: 1500, in_service_since: '2026-11-01', created_at: at, updated_at: at });
}

const booking = (shopId: string, jobId: string, customerId: string, kitId: string, from: string, to: string) => ({
  id: newId(),
  shop_id: shopId,
  job_id: jobId,
  kit_id: kitId,
  customer_user_id: customerId,
  dealer_id: null,
  state: 'booked' as const,
  start_date: from,
  due_date: to,
  blocked_from: from,
  blocked_to: to,
  currency: 'USD',
  fee_minor: 9000,
  deposit_minor: 30000,
  late_fee_per_day_minor: 1500,
  created_at: nowIso(),
  updated_at: nowIso(),
});

describe('rental repository', () => {
  it('another shop’s kits and rentals read as undefined and do not change', async () => {
    const { db, shopA, shopB, ownerB } = await twoShops();
    const kit = await kitIn(db, shopB);
    const job = await jobIn(db, shopB, ownerB);
    const result = await insertRentalIfFree(db, booking(shopB, job.id, ownerB, kit.id, '2026-12-10', '2026-12-16'));
    if (!result.ok) throw new Error('expected a booking');
    expect(await findKit(db, shopA, kit.id)).toBeUndefined();
    expect(await listKits(db, shopA, { includeRetired: true })).toEqual([]);
    expect(await updateKit(db, shopA, kit.id, { name: 'Taken' })).toBeUndefined();
    expect(await findRental(db, shopA, result.rental.id)).toBeUndefined();
    expect(await listRentals(db, shopA, { kind: 'shop' })).toEqual([]);
    expect(await updateRental(db, shopA, result.rental.id, { state: 'cancelled' })).toBeUndefined();
    expect((await findRental(db, shopB, result.rental.id))?.state).toBe('booked');
    expect(await findRental(db, shopB, result.rental.id, { kind: 'customer', userId: 'someone-else' })).toBeUndefined();
  });

  it('of two overlapping bookings started together exactly one is written', async () => {
    const { db, shopA, ownerA } = await twoShops();
    const kit = await kitIn(db, shopA);
    const job = await jobIn(db, shopA, ownerA);
    const results = await Promise.all([
      insertRentalIfFree(db, booking(shopA, job.id, ownerA, kit.id, '2026-12-10', '2026-12-16')),
      insertRentalIfFree(db, booking(shopA, job.id, ownerA, kit.id, '2026-12-16', '2026-12-20')),
    ]);
    expect(results.filter((r) => r.ok)).toHaveLength(1);
    expect(results.filter((r) => !r.ok)).toHaveLength(1);
    // [CALC] inclusive ranges: a booking starting the day after the last blocked day is free.
    expect((await insertRentalIfFree(db, booking(shopA, job.id, ownerA, kit.id, '2026-12-17', '2026-12-20'))).ok).toBe(true);
    expect(await listRentals(db, shopA, { kind: 'shop' }, { kitId: kit.id })).toHaveLength(2);
  });

  it('money lines and reminders apply once', async () => {
    const { db, shopA, ownerA } = await twoShops();
    const kit = await kitIn(db, shopA);
    const job = await jobIn(db, shopA, ownerA);
    const result = await insertRentalIfFree(db, booking(shopA, job.id, ownerA, kit.id, '2026-12-10', '2026-12-16'));
    if (!result.ok) throw new Error('expected a booking');
    const entry = { shop_id: shopA, rental_id: result.rental.id, kind: 'fee' as const, amount_minor: 9000, description: 'Rental fee', provider_ref: 'cs_1', at: nowIso() };
    expect(await insertRentalEntry(db, { ...entry, id: newId() })).toBe(true);
    expect(await insertRentalEntry(db, { ...entry, id: newId() })).toBe(false);
    const reminder = { rental_id: result.rental.id, kind: 'due_soon', day: '2026-12-14', shop_id: shopA, sent_at: nowIso() };
    expect(await claimRentalReminder(db, reminder)).toBe(true);
    expect(await claimRentalReminder(db, reminder)).toBe(false);
  });
});
