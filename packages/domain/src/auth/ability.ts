import {
  AbilityBuilder,
  createMongoAbility,
  subject as caslSubject,
  type ForcedSubject,
  type MongoAbility,
  type MongoQuery,
} from '@casl/ability';
import type { Actor } from './roles';

/**
 * The one definition of who may do what. The API checks it on every route; the web hides what it forbids.
 * Row-level conditions use the same column names as the API objects (camelCase).
 */
export type Action =
  | 'manage'
  | 'read'
  | 'create'
  | 'update'
  | 'delete'
  | 'invite'
  | 'suspend'
  | 'assign'
  | 'take'
  | 'transition'
  | 'upload'
  | 'upload_revision'
  | 'download'
  | 'refund'
  /** Rentals: pick a kit and dates for a job (staff); agree to the rental terms (the job's customer or dealer). */
  | 'book'
  | 'agree';

export const SUBJECTS = [
  'Platform',
  'Shop',
  'Member',
  'Invitation',
  'Dealer',
  'Customer',
  'Vehicle',
  'Package',
  'Job',
  'Message',
  'Payment',
  'Subscription',
  'Ledger',
  'AuditEvent',
  'ShopSettings',
  /** The local SMTP stand-in's mailbox (development and demo): it holds reset links, so only platform admins read it. */
  'Mailbox',
  /** Flashing kits the shop rents out, and their rentals (issue 14). */
  'Kit',
  'Rental',
] as const;
export type SubjectName = (typeof SUBJECTS)[number];

/** A plain API object tagged with its subject name, one union member per name so CASL can type conditions. */
export type TaggedSubject = { [N in SubjectName]: Record<string, unknown> & ForcedSubject<N> }[SubjectName];
export type AppSubject = SubjectName | 'all' | TaggedSubject;
// Conditions are loose Mongo queries over the API objects' camelCase fields.
export type AppAbility = MongoAbility<[Action, AppSubject], MongoQuery>;

/** Tags a plain object so CASL checks it against the rules of `type`. */
export const asSubject = <N extends SubjectName, T extends object>(type: N, object: T) =>
  caslSubject(type, object) as T & Record<string, unknown> & ForcedSubject<N>;

const CRUD: Action[] = ['read', 'create', 'update', 'delete'];

const WRITE_ACTIONS: Action[] = [
  'create',
  'update',
  'delete',
  'invite',
  'assign',
  'take',
  'transition',
  'upload',
  'upload_revision',
  'refund',
];

export function defineAbilityFor(actor: Actor | null): AppAbility {
  const { can, cannot, build } = new AbilityBuilder<AppAbility>(createMongoAbility);
  if (!actor) return build();

  if (actor.platformAdmin) {
    can('manage', 'Platform');
    can(['read', 'create', 'update', 'suspend'], 'Shop');
    can('read', 'Subscription');
    can('read', 'AuditEvent');
    can(['read', 'delete'], 'Mailbox');
    // Platform admins never read a shop's jobs, files or logs without an audited support grant.
    return build();
  }

  const shopId = actor.shopId;
  if (!shopId || !actor.role) return build();
  const me = actor.userId;
  const inShop = { shopId };

  can('read', 'Shop', { id: shopId });
  can('read', 'Package', inShop);

  switch (actor.role) {
    case 'owner':
      can('update', 'Shop', { id: shopId });
      can(CRUD, 'ShopSettings', inShop);
      can(['read', 'invite', 'update', 'delete'], ['Member', 'Invitation'], inShop);
      can('create', 'Invitation', inShop);
      can(CRUD, ['Dealer', 'Customer', 'Vehicle', 'Package', 'Message', 'Payment', 'Ledger', 'Subscription'], inShop);
      can('read', 'AuditEvent', inShop);
      can(
        ['read', 'create', 'update', 'assign', 'transition', 'upload', 'upload_revision', 'download'],
        'Job',
        inShop,
      );
      can('refund', 'Payment', inShop);
      break;
    case 'tuner':
      can('read', 'Member', inShop);
      can('read', 'Dealer', inShop);
      can(['read', 'create', 'update'], ['Customer', 'Vehicle'], inShop);
      can('create', 'Job', inShop);
      can(['read', 'update', 'transition', 'upload', 'upload_revision', 'download'], 'Job', {
        shopId,
        assignedTunerId: { $in: [me, null] },
      });
      can('take', 'Job', { shopId, assignedTunerId: null });
      can(['read', 'create'], 'Message', inShop);
      can('read', 'Payment', inShop);
      break;
    case 'dealer': {
      const dealerId = actor.dealerId;
      if (!dealerId) break;
      const ofDealer = { shopId, dealerId };
      can('read', 'Dealer', { shopId, id: dealerId });
      can(['read', 'create', 'update'], ['Customer', 'Vehicle'], ofDealer);
      can(['read', 'create', 'upload', 'download'], 'Job', ofDealer);
      can(['read', 'create'], 'Message', ofDealer);
      can('read', 'Ledger', ofDealer);
      can(['read', 'create'], 'Payment', ofDealer);
      break;
    }
    case 'customer': {
      const mine = { shopId, customerUserId: me };
      can(['read', 'create', 'update'], 'Vehicle', { shopId, ownerUserId: me });
      can(['read', 'create', 'upload', 'download'], 'Job', mine);
      can(['read', 'create'], 'Message', mine);
      can(['read', 'create'], 'Payment', mine);
      break;
    }
  }

  defineRentalRules(actor, shopId, can, cannot);

  if (actor.shopReadOnly) {
    // A suspended or lapsed shop keeps reading and downloading, and the owner can still pay to restore it.
    cannot(WRITE_ACTIONS, ['Member', 'Invitation', 'Dealer', 'Customer', 'Vehicle', 'Package', 'Job', 'Message', 'ShopSettings']);
    cannot('update', 'Shop');
    // Nor does it move money: no charge for work it cannot do now (job checkout), no dealer top-up or ledger entry,
    // no refund (docs/decisions/008). Only the owner's own payment to the platform (Subscription) stays open.
    cannot(WRITE_ACTIONS, ['Payment', 'Ledger']);
  }
  return build();
}

type RuleFn = AbilityBuilder<AppAbility>['can'];

/**
 * Kits and rentals. Rental objects carry the job's `customerUserId` and `dealerId`. Customers and dealers see every
 * kit's busy days (the calendar shows them no other rental: they may not read it), ask for a rental on their jobs
 * and agree to its terms; staff book; the owner manages kits. Which move each role makes is in the rental machine.
 */
function defineRentalRules(actor: Actor, shopId: string, can: RuleFn, cannot: RuleFn): void {
  const inShop = { shopId };
  can('read', 'Kit', inShop);
  switch (actor.role) {
    case 'owner':
      can(['create', 'update'], 'Kit', inShop);
      can(['read', 'create', 'book', 'transition', 'update'], 'Rental', inShop);
      break;
    case 'tuner':
      can(['read', 'create', 'book', 'transition'], 'Rental', inShop);
      break;
    case 'dealer':
      if (actor.dealerId) can(['read', 'create', 'transition', 'agree'], 'Rental', { shopId, dealerId: actor.dealerId });
      break;
    case 'customer':
      can(['read', 'create', 'transition', 'agree'], 'Rental', { shopId, customerUserId: actor.userId });
      break;
  }
  if (actor.shopReadOnly) cannot(['create', 'update', 'book', 'transition', 'agree'], ['Kit', 'Rental']);
}

/** Row scope for rental lists: the SQL twin of the Rental conditions above. */
export type RentalScopeKind = { kind: 'none' } | { kind: 'shop' } | { kind: 'dealer'; dealerId: string } | { kind: 'customer'; userId: string };

export function rentalScopeFor(actor: Actor): RentalScopeKind {
  if (actor.platformAdmin || !actor.shopId) return { kind: 'none' };
  if (actor.role === 'owner' || actor.role === 'tuner') return { kind: 'shop' };
  if (actor.role === 'dealer') return actor.dealerId ? { kind: 'dealer', dealerId: actor.dealerId } : { kind: 'none' };
  if (actor.role === 'customer') return { kind: 'customer', userId: actor.userId };
  return { kind: 'none' };
}

/** Row scope for list queries: the SQL twin of the Job conditions above, so lists and checks agree. */
export type JobScope =
  | { kind: 'none' }
  | { kind: 'shop' }
  | { kind: 'tuner'; userId: string }
  | { kind: 'dealer'; dealerId: string }
  | { kind: 'customer'; userId: string };

export function jobScopeFor(actor: Actor): JobScope {
  if (actor.platformAdmin || !actor.shopId) return { kind: 'none' };
  switch (actor.role) {
    case 'owner':
      return { kind: 'shop' };
    case 'tuner':
      return { kind: 'tuner', userId: actor.userId };
    case 'dealer':
      return actor.dealerId ? { kind: 'dealer', dealerId: actor.dealerId } : { kind: 'none' };
    case 'customer':
      return { kind: 'customer', userId: actor.userId };
    default:
      return { kind: 'none' };
  }
}
