import { describe, expect, it } from 'vitest';
import { newId, nowIso } from '../ids';
import { twoShops } from '../testing/two-shops';
import { insertAuditEvent, listAuditEvents } from './audit-event.repository';

describe('audit event repository', () => {
  it('lists only the shop’s own events', async () => {
    const { db, shopA, shopB, ownerB } = await twoShops();
    await insertAuditEvent(db, {
      id: newId(),
      shop_id: shopB,
      actor_user_id: ownerB,
      action: 'member.invited',
      subject_type: 'Invitation',
      subject_id: 'x',
      created_at: nowIso(),
    });
    expect(await listAuditEvents(db, shopA)).toEqual([]);
    expect(await listAuditEvents(db, shopB)).toHaveLength(1);
  });
});
