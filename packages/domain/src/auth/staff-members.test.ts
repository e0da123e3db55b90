import { describe, expect, it } from 'vitest';
import { asSubject, defineAbilityFor } from './ability';
import type { Actor } from './roles';

const S = 'shop-1';
const actor = (role: Actor['role']): Actor => ({ userId: 'u-1', platformAdmin: false, shopId: S, role, dealerId: null, shopReadOnly: false });

describe('Member rows are staff only', () => {
  it('lets the owner read and change staff, never a customer membership nor a change to customer', () => {
    const owner = defineAbilityFor(actor('owner'));
    for (const role of ['owner', 'tuner', 'dealer']) expect(owner.can('update', asSubject('Member', { shopId: S, role }))).toBe(true);
    expect(owner.can('read', asSubject('Member', { shopId: S, role: 'customer' }))).toBe(false);
    expect(owner.can('update', asSubject('Member', { shopId: S, role: 'customer' }))).toBe(false);
  });

  it('lets tuners read staff only', () => {
    const tuner = defineAbilityFor(actor('tuner'));
    expect(tuner.can('read', asSubject('Member', { shopId: S, role: 'owner' }))).toBe(true);
    expect(tuner.can('read', asSubject('Member', { shopId: S, role: 'customer' }))).toBe(false);
  });
});
