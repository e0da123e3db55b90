import { describe, expect, it } from 'vitest';
import { defineAbilityFor, type Actor, type ShopRole } from '@revloop/domain/auth';
import { canOpen, homePathFor, navItemsFor } from './nav-items';

const actor = (role: ShopRole | null, extra: Partial<Actor> = {}): Actor => ({
  userId: 'u1',
  platformAdmin: false,
  shopId: 's1',
  role,
  dealerId: role === 'dealer' ? 'd1' : null,
  shopReadOnly: false,
  ...extra,
});

const labels = (a: Actor, role: ShopRole | 'platform_admin' | null) => navItemsFor(defineAbilityFor(a), { role }).map((item) => item.label);

// Expected menus are the product brief's per-role navigation [CP: Revloop web brief].
describe('navItemsFor', () => {
  it('gives each role its own menu', () => {
    expect(labels(actor(null, { platformAdmin: true, shopId: null }), 'platform_admin')).toEqual(['Shops', 'Revenue']);
    expect(labels(actor('owner'), 'owner')).toEqual(['Jobs', 'Customers', 'Team', 'Dealers', 'Reports', 'Kits', 'Billing', 'Settings']);
    expect(labels(actor('tuner'), 'tuner')).toEqual(['Jobs', 'Customers', 'Team', 'Kits']);
    expect(labels(actor('dealer'), 'dealer')).toEqual(['Jobs', 'Customers', 'Statement']);
    expect(labels(actor('customer'), 'customer')).toEqual(['My jobs', 'Vehicles']);
  });

  it('keeps the owner menu in a suspended shop, where only writes are forbidden', () => {
    expect(labels(actor('owner', { shopReadOnly: true }), 'owner')).toEqual(['Jobs', 'Customers', 'Team', 'Dealers', 'Reports', 'Kits', 'Billing', 'Settings']);
  });

  it('shows nothing to a user without a role', () => {
    expect(labels(actor(null), null)).toEqual([]);
  });
});

describe('canOpen', () => {
  it('keeps the dealer list to the owner, though tuners and dealers may read dealer rows', () => {
    expect(canOpen('dealers', defineAbilityFor(actor('owner')), { role: 'owner' })).toBe(true);
    expect(canOpen('dealers', defineAbilityFor(actor('tuner')), { role: 'tuner' })).toBe(false);
    expect(canOpen('dealers', defineAbilityFor(actor('dealer')), { role: 'dealer' })).toBe(false);
  });
});

describe('the development mailbox', () => {
  it('opens for a platform admin only (it holds reset links)', () => {
    expect(canOpen('mailbox', defineAbilityFor(actor(null, { platformAdmin: true, shopId: null })), { role: 'platform_admin' })).toBe(true);
    for (const role of ['owner', 'tuner', 'dealer', 'customer'] as const) expect(canOpen('mailbox', defineAbilityFor(actor(role)), { role })).toBe(false);
    expect(canOpen('mailbox', defineAbilityFor(null), { role: null })).toBe(false);
  });
});

describe('homePathFor', () => {
  it('sends admins to shops and everyone else to jobs', () => {
    expect(homePathFor(defineAbilityFor(actor(null, { platformAdmin: true, shopId: null })), { role: 'platform_admin' })).toBe('/admin/shops');
    expect(homePathFor(defineAbilityFor(actor('customer')), { role: 'customer' })).toBe('/jobs');
  });
});
