import { describe, expect, it } from 'vitest';
import { newId, nowIso } from '../ids';
import { twoShops } from '../testing/two-shops';
import { findInvitation, insertInvitation, listPendingInvitations, revokeInvitation } from './invitation.repository';

describe('invitation repository', () => {
  it('never lists, reads or revokes another shop’s invitation', async () => {
    const { db, shopA, shopB } = await twoShops();
    const now = nowIso();
    const inv = await insertInvitation(db, {
      id: newId(),
      shop_id: shopB,
      email: 't@example.test',
      role: 'tuner',
      token_hash: 'h1',
      created_at: now,
      expires_at: new Date(Date.now() + 86_400_000).toISOString(),
    });
    expect(await findInvitation(db, shopA, inv.id)).toBeUndefined();
    expect(await listPendingInvitations(db, shopA, now)).toEqual([]);
    expect(await revokeInvitation(db, shopA, inv.id, now)).toBe(false);
    expect(await listPendingInvitations(db, shopB, now)).toHaveLength(1);
  });
});
