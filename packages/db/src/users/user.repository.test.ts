import { describe, expect, it } from 'vitest';
import { twoShops } from '../testing/two-shops';
import { findMembership, findMembershipOfUser, listMembers, updateMembership } from './user.repository';

describe('membership repository', () => {
  it('never reads or changes another shop’s membership', async () => {
    const { db, shopA, shopB, ownerB } = await twoShops();
    const [memberB] = await listMembers(db, shopB);
    expect(memberB).toBeDefined();
    expect(await findMembership(db, shopA, memberB!.id)).toBeUndefined();
    expect(await findMembershipOfUser(db, shopA, ownerB)).toBeUndefined();
    expect(await updateMembership(db, shopA, memberB!.id, { role: 'tuner' })).toBeUndefined();
    expect((await findMembership(db, shopB, memberB!.id))?.role).toBe('owner');
    expect((await listMembers(db, shopA)).map((m) => m.email)).toEqual(['a@example.test']);
  });

  it('refuses a dealer membership without a dealer account (schema check)', async () => {
    const { db, shopA, ownerA } = await twoShops();
    await expect(
      db.updateTable('memberships').set({ role: 'dealer' }).where('user_id', '=', ownerA).where('shop_id', '=', shopA).execute(),
    ).rejects.toThrow(/check constraint/i);
  });
});
