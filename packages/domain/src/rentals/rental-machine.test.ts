import { describe, expect, it } from 'vitest';
import type { Actor } from '../auth/roles';
import { defineAbilityFor, asSubject } from '../auth/ability';
import { assertRentalMove, availableRentalMoves, kitStatusAfterMove, RENTAL_MOVES, type RentalFacts } from './rental-machine';
import { kitOutBlock } from './job-kit-guard';
import { settleDeposit, holdNeedsRenewal, MERCHANT_HOLD_MS, CUSTOMER_HOLD_MS } from './deposit-holds';

const actor = (role: Actor['role'], extra: Partial<Actor> = {}): Actor => ({
  userId: `${role}-1`,
  platformAdmin: false,
  shopId: 'shop-1',
  role,
  dealerId: role === 'dealer' ? 'dealer-1' : null,
  shopReadOnly: false,
  ...extra,
});
const facts = (state: RentalFacts['state']): RentalFacts => ({
  state,
  kitId: 'kit-1',
  customerUserId: 'customer-1',
  dealerId: 'dealer-1',
  termsAccepted: true,
  feePaid: true,
  depositDue: true,
  cardSaved: true,
});

const ROLES = {
  owner: actor('owner'),
  tuner: actor('tuner'),
  customer: actor('customer'),
  otherCustomer: actor('customer', { userId: 'customer-2' }),
  dealer: actor('dealer'),
};

// Every move × every role: allowed ones pass, the rest are refused as forbidden.
const ALLOWED: Record<string, (keyof typeof ROLES)[]> = {
  'requested>booked': ['owner', 'tuner'],
  'booked>shipped': ['owner', 'tuner'],
  'shipped>with_customer': ['owner', 'tuner', 'customer', 'dealer'],
  'shipped>returned': ['owner', 'tuner'],
  'with_customer>returned': ['owner', 'tuner'],
  'returned>closed': ['owner'],
  'requested>cancelled': ['owner', 'tuner', 'customer', 'dealer'],
  'booked>cancelled': ['owner', 'tuner'],
};

describe('rental moves by role', () => {
  const pairs = RENTAL_MOVES.flatMap((m) => m.from.map((from) => [from, m.to] as const));
  it('covers every move in the table', () => {
    expect(pairs.map(([f, t]) => `${f}>${t}`).sort()).toEqual(Object.keys(ALLOWED).sort());
  });
  for (const [from, to] of pairs) {
    for (const [name, who] of Object.entries(ROLES)) {
      const allowed = ALLOWED[`${from}>${to}`]!.includes(name as keyof typeof ROLES);
      it(`${from} → ${to} by ${name}: ${allowed ? 'allowed' : 'refused'}`, () => {
        const run = () => assertRentalMove(facts(from), who, to);
        if (allowed) expect(run).not.toThrow();
        else expect(run).toThrow(expect.objectContaining({ code: 'forbidden' }));
      });
    }
  }
  it('refuses moves that skip states, and from final states', () => {
    expect(() => assertRentalMove(facts('requested'), ROLES.owner, 'shipped')).toThrow(expect.objectContaining({ code: 'invalid_transition' }));
    expect(() => assertRentalMove(facts('closed'), ROLES.owner, 'cancelled')).toThrow(expect.objectContaining({ code: 'invalid_transition' }));
    expect(() => assertRentalMove(facts('shipped'), ROLES.owner, 'cancelled')).toThrow(expect.objectContaining({ code: 'invalid_transition' }));
  });
  it('ships only with terms agreed, fee paid and card saved', () => {
    for (const missing of ['termsAccepted', 'feePaid', 'cardSaved'] as const) {
      const f = { ...facts('booked'), [missing]: false };
      expect(() => assertRentalMove(f, ROLES.owner, 'shipped')).toThrow(expect.objectContaining({ code: 'invalid_transition' }));
      expect(availableRentalMoves(f, ROLES.owner).map((m) => m.to)).toEqual(['cancelled']);
    }
    expect(() => assertRentalMove({ ...facts('booked'), depositDue: false, cardSaved: false }, ROLES.owner, 'shipped')).not.toThrow();
  });
  it('a read-only shop moves nothing', () => {
    expect(() => assertRentalMove(facts('requested'), actor('owner', { shopReadOnly: true }), 'booked')).toThrow(expect.objectContaining({ code: 'shop_read_only' }));
  });
  it('moves the kit status along', () => {
    expect(kitStatusAfterMove('available', 'booked', 0)).toBe('booked');
    expect(kitStatusAfterMove('booked', 'shipped', 0)).toBe('out');
    expect(kitStatusAfterMove('out', 'returned', 0)).toBe('in_inspection');
    expect(kitStatusAfterMove('booked', 'cancelled', 1)).toBe('booked');
    expect(kitStatusAfterMove('booked', 'cancelled', 0)).toBe('available');
  });
});

describe('rental abilities', () => {
  const rental = asSubject('Rental', { shopId: 'shop-1', customerUserId: 'customer-1', dealerId: 'dealer-1' });
  const other = asSubject('Rental', { shopId: 'shop-1', customerUserId: 'customer-2', dealerId: null });
  it('owner manages kits, tuner reads them and books', () => {
    expect(defineAbilityFor(ROLES.owner).can('create', asSubject('Kit', { shopId: 'shop-1' }))).toBe(true);
    expect(defineAbilityFor(ROLES.tuner).can('create', asSubject('Kit', { shopId: 'shop-1' }))).toBe(false);
    expect(defineAbilityFor(ROLES.tuner).can('book', rental)).toBe(true);
    expect(defineAbilityFor(ROLES.customer).can('book', rental)).toBe(false);
  });
  it('customers and dealers read only their own rentals', () => {
    expect(defineAbilityFor(ROLES.customer).can('read', rental)).toBe(true);
    expect(defineAbilityFor(ROLES.customer).can('read', other)).toBe(false);
    expect(defineAbilityFor(ROLES.dealer).can('read', rental)).toBe(true);
    expect(defineAbilityFor(ROLES.dealer).can('read', other)).toBe(false);
    expect(defineAbilityFor(actor('owner', { shopId: 'shop-2' })).can('read', rental)).toBe(false);
  });
});

describe('dialed-in guard for a kit still out', () => {
  it('blocks unless the owner overrides', () => {
    expect(kitOutBlock(['closed'], ROLES.tuner, false)).toBeNull();
    expect(kitOutBlock(['with_customer'], ROLES.tuner, false)).toMatch(/still out/);
    expect(kitOutBlock(['shipped'], ROLES.tuner, true)).toMatch(/Only the owner/);
    expect(kitOutBlock(['shipped'], ROLES.owner, true)).toBeNull();
  });
});

describe('deposit holds', () => {
  it('hold windows are those the provider documents', () => {
    // [3P] provider docs "Place a hold on a payment method": 7 days online customer-initiated; Visa MIT 4 days 18 hours.
    expect(CUSTOMER_HOLD_MS).toBe(604_800_000);
    expect(MERCHANT_HOLD_MS).toBe(410_400_000);
  });
  it('renews a day before lapse', () => {
    const placed = new Date('2026-12-01T10:00:00Z');
    const expires = new Date(placed.getTime() + MERCHANT_HOLD_MS); // 2026-12-06T04:00Z
    expect(holdNeedsRenewal(expires, new Date('2026-12-05T03:59:00Z'))).toBe(false);
    expect(holdNeedsRenewal(expires, new Date('2026-12-05T04:00:00Z'))).toBe(true);
  });
  it('takes what is owed from the hold first, the rest off-session', () => {
    // [CALC] 300.00 held; 3 late days × 15.00 = 45.00 plus 120.00 damage = 165.00 captured, 135.00 released.
    expect(settleDeposit(30000, 4500, 12000)).toEqual({ captureMinor: 16500, chargeMinor: 0, lateFeeMinor: 4500, damageMinor: 12000 });
    expect(settleDeposit(10000, 4500, 12000)).toMatchObject({ captureMinor: 10000, chargeMinor: 6500 });
  });
});
