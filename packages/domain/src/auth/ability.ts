import {
  AbilityBuilder,
  createMongoAbility,
  subject as caslSubject,
  type ForcedSubject,
  type MongoAbility,
  type MongoQuery,
} from '@casl/ability';
import { STAFF_ROLES, type Actor } from './roles';

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
  | 'refund';

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
  // Team is staff only: a customer's membership is never a Member row to read or change, nor a role to change one to.
  const staffMember = { shopId, role: { $in: [...STAFF_ROLES] } };

  can('read', 'Shop', { id: shopId });
  can('read', 'Package', inShop);

  switch (actor.role) {
    case 'owner':
      can('update', 'Shop', { id: shopId });
      can(CRUD, 'ShopSettings', inShop);
      can(['read', 'invite', 'update', 'delete'], 'Member', staffMember);
      can(['read', 'invite', 'update', 'delete'], 'Invitation', inShop);
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
      can('read', 'Member', staffMember);
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
