import { describe, expect, it } from 'vitest';
import { asSubject, defineAbilityFor, SUBJECTS, type Action, type SubjectName } from './ability';
import type { Actor } from './roles';

const S = 'shop-own';
const OTHER = 'shop-other';
const ME = 'user-me';
const D = 'dealer-own';

const ACTIONS: Action[] = ['read', 'create', 'update', 'delete', 'invite', 'suspend', 'assign', 'take', 'transition', 'upload', 'upload_revision', 'download', 'refund', 'waive'];

type Who = 'admin' | 'owner' | 'tuner' | 'dealer' | 'customer';
const actors: Record<Who, Actor> = {
  admin: { userId: ME, platformAdmin: true, shopId: null, role: null, dealerId: null, shopReadOnly: false },
  owner: { userId: ME, platformAdmin: false, shopId: S, role: 'owner', dealerId: null, shopReadOnly: false },
  tuner: { userId: ME, platformAdmin: false, shopId: S, role: 'tuner', dealerId: null, shopReadOnly: false },
  dealer: { userId: ME, platformAdmin: false, shopId: S, role: 'dealer', dealerId: D, shopReadOnly: false },
  customer: { userId: ME, platformAdmin: false, shopId: S, role: 'customer', dealerId: null, shopReadOnly: false },
};

/** The row each role would normally touch: its own shop, its own dealer, its own customer account, its own job. */
const ownRow = (shopId: string, subject: SubjectName) =>
  subject === 'Shop'
    ? { id: shopId }
    : subject === 'Dealer'
      ? { id: D, shopId }
      : subject === 'Member'
        ? { shopId, role: 'tuner' }
        : { shopId, dealerId: D, customerUserId: ME, ownerUserId: ME, assignedTunerId: ME };

/**
 * Expected permissions on an own-shop row, written out by hand from the product's role table (DESIGN.md),
 * independent of how ability.ts builds them. Subjects not listed allow nothing.
 */
const CRUD: Action[] = ['read', 'create', 'update', 'delete'];
const EXPECTED: Record<Who, Partial<Record<SubjectName, Action[]>>> = {
  admin: { Platform: ACTIONS, Shop: ['read', 'create', 'update', 'suspend'], Subscription: ['read'], AuditEvent: ['read'], Mailbox: ['read', 'delete'] },
  owner: {
    Shop: ['read', 'update'],
    ShopSettings: CRUD,
    Member: ['read', 'invite', 'update', 'delete'],
    Invitation: ['read', 'create', 'invite', 'update', 'delete'],
    Dealer: CRUD,
    Customer: CRUD,
    Vehicle: CRUD,
    Package: CRUD,
    Message: CRUD,
    Payment: [...CRUD, 'refund', 'waive'],
    Ledger: CRUD,
    Subscription: CRUD,
    AuditEvent: ['read'],
    Report: ['read'],
    Job: ['read', 'create', 'update', 'assign', 'transition', 'upload', 'upload_revision', 'download'],
    File: ['read'],
    Approval: ['read'],
    Kit: ['read', 'create', 'update'],
    Rental: ['read', 'create', 'update', 'transition'],
  },
  tuner: {
    Shop: ['read'],
    Package: ['read'],
    Member: ['read'],
    Dealer: ['read'],
    Customer: ['read', 'create', 'update'],
    Vehicle: ['read', 'create', 'update'],
    Job: ['read', 'create', 'update', 'transition', 'upload', 'upload_revision', 'download'],
    File: ['read'],
    Approval: ['read'],
    Message: ['read', 'create'],
    Payment: ['read'],
    Kit: ['read'],
    Rental: ['read', 'create', 'transition'],
  },
  dealer: {
    Shop: ['read'],
    Package: ['read'],
    Dealer: ['read'],
    Customer: ['read', 'create', 'update'],
    Vehicle: ['read', 'create', 'update'],
    Job: ['read', 'create', 'upload', 'download'],
    Message: ['read', 'create'],
    Ledger: ['read'],
    Payment: ['read', 'create'],
    Kit: ['read'],
    Rental: ['read', 'create', 'transition'],
  },
  customer: {
    Shop: ['read'],
    Package: ['read'],
    Vehicle: ['read', 'create', 'update'],
    Job: ['read', 'create', 'upload', 'download'],
    Message: ['read', 'create'],
    Payment: ['read', 'create'],
    Kit: ['read'],
    Rental: ['read', 'create', 'transition'],
  },
};

describe('ability matrix: every role × action × subject', () => {
  for (const who of Object.keys(actors) as Who[]) {
    const ability = defineAbilityFor(actors[who]);
    for (const subject of SUBJECTS) {
      it(`${who} on own-shop ${subject}`, () => {
        const allowed = ACTIONS.filter((a) => ability.can(a, asSubject(subject, ownRow(S, subject))));
        expect(allowed.sort()).toEqual([...(EXPECTED[who][subject] ?? [])].sort());
      });
      it(`${who} on other-shop ${subject}`, () => {
        const allowed = ACTIONS.filter((a) => ability.can(a, asSubject(subject, ownRow(OTHER, subject))));
        // A platform admin manages shops as such, never another shop's contents.
        const expected = who === 'admin' ? (EXPECTED.admin[subject] ?? []) : [];
        expect(allowed.sort()).toEqual([...expected].sort());
      });
    }
  }
});

describe('row-level rules inside one shop', () => {
  const job = (over: Record<string, unknown>) => asSubject('Job', { shopId: S, dealerId: null, customerUserId: 'someone', assignedTunerId: null, ...over });

  it('a tuner works jobs assigned to them or unassigned, and takes only unassigned ones', () => {
    const a = defineAbilityFor(actors.tuner);
    expect(a.can('read', job({ assignedTunerId: 'other-tuner' }))).toBe(false);
    expect(a.can('upload_revision', job({ assignedTunerId: null }))).toBe(true);
    expect(a.can('take', job({ assignedTunerId: null }))).toBe(true);
    expect(a.can('take', job({ assignedTunerId: ME }))).toBe(false);
  });

  it('a dealer sees only its own customers’ jobs; a customer only their own', () => {
    expect(defineAbilityFor(actors.dealer).can('read', job({ dealerId: 'other-dealer' }))).toBe(false);
    expect(defineAbilityFor(actors.dealer).can('read', job({ dealerId: D }))).toBe(true);
    expect(defineAbilityFor(actors.customer).can('read', job({ customerUserId: 'another-customer' }))).toBe(false);
    expect(defineAbilityFor(actors.customer).can('upload_revision', job({ customerUserId: ME }))).toBe(false);
  });

  it('a read-only shop keeps reading and downloading but writes nothing', () => {
    const a = defineAbilityFor({ ...actors.owner, shopReadOnly: true });
    expect(a.can('read', job({}))).toBe(true);
    expect(a.can('download', job({}))).toBe(true);
    for (const action of ['create', 'update', 'transition', 'upload', 'upload_revision', 'assign'] as const) {
      expect(a.can(action, job({}))).toBe(false);
    }
    expect(a.can('invite', asSubject('Member', { shopId: S }))).toBe(false);
    // The owner can still pay the platform to restore the shop.
    expect(a.can('update', asSubject('Subscription', { shopId: S }))).toBe(true);
  });

  it('a read-only shop moves no money: no job charge, top-up, ledger entry or refund, for any role', () => {
    const payment = asSubject('Payment', { shopId: S, dealerId: D, customerUserId: ME });
    const ledger = asSubject('Ledger', { shopId: S, dealerId: D });
    for (const who of ['owner', 'tuner', 'dealer', 'customer'] as const) {
      const a = defineAbilityFor({ ...actors[who], shopReadOnly: true });
      for (const action of ['create', 'update', 'delete', 'refund', 'waive'] as const) {
        expect(a.can(action, payment)).toBe(false);
        expect(a.can(action, ledger)).toBe(false);
      }
      // Reading what was paid stays open to whoever could read it before.
      expect(a.can('read', payment)).toBe(defineAbilityFor(actors[who]).can('read', payment));
    }
  });

  it('nobody signed in can do nothing', () => {
    const a = defineAbilityFor(null);
    expect(ACTIONS.some((x) => SUBJECTS.some((s) => a.can(x, s)))).toBe(false);
  });
});
