import { describe, expect, it } from 'vitest';
import { newId, nowIso } from '../ids';
import { twoShops } from '../testing/two-shops';
import { countUnreadNotifications, insertNotifications, listNotifications, markNotificationsRead } from './notification.repository';

describe('notification repository', () => {
  it('keeps each shop’s notifications to itself', async () => {
    const { db, shopA, shopB, ownerB } = await twoShops();
    const id = newId();
    await insertNotifications(db, [{ id, shop_id: shopB, user_id: ownerB, job_id: null, kind: 'job_received', title: 'New job', body: 'x', read_at: null, created_at: nowIso() }]);
    expect(await listNotifications(db, shopA, ownerB)).toEqual([]);
    expect(await countUnreadNotifications(db, shopA, ownerB)).toBe(0);
    await markNotificationsRead(db, shopA, ownerB, nowIso(), [id]);
    expect(await countUnreadNotifications(db, shopB, ownerB)).toBe(1);
  });
});
