import {
  AbilityBuilder,
  createMongoAbility,
  subject as caslSubject,
  type ForcedSubject,
  type MongoAbility,
  type MongoQuery,
} from '@casl/ability';
import { OPEN_STATES } from '../jobs/job-states';
import { STAFF_ROLES, type Actor } from './roles';

/**
 * The one definition of who may do what. The API checks it on every route; the web hides what it forbids.
 * Row-level conditions use the same column names as the API objects (camelCase).
 * Job moves: the action is `transition`, its field the target state and its conditions may name the job's current
 * `state`, checked as `ability.can('transition', jobMoveSubject(facts), to)` (jobs/job-moves.ts). The state machine
 * says which moves exist and what they need; these rules say who may make them.
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
  /** Compare a calibration file with the job's revisions (File only). */
  | 'verify'
  /** Rentals: pick a kit and dates for a job (staff); agree to the rental terms (the job's customer or dealer). */
  | 'book'
  | 'agree'
  /** Approve a revision draft before it is sent (File only; never the uploader's own). */
  | 'approve'
  /** Waive a job's paid-before-download lock, so its customer downloads before paying (Payment only; the owner). */
  | 'waive';

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
  /** A calibration file of a job, as `fileSubject` describes it. */
  'File',
  'Message',
  'Payment',
  'Subscription',
  'Ledger',
  'AuditEvent',
  'ShopSettings',
  /** The local SMTP stand-in's mailbox (development and demo): it holds reset links, so only platform admins read it. */
  'Mailbox',
  /** The shop's reports: turnaround, rounds, tuner load, revenue and log quality (owner only). */
  'Report',
  /** Flashing kits the shop rents out, and their rentals (issue 14). */
  'Kit',
  'Rental',
  /** Who approved which revision draft: the shop's own business, shown on the staff side of the timeline. */
  'Approval',
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
  'approve',
  'waive',
];

export function defineAbilityFor(actor: Actor | null): AppAbility {
  const { can, cannot, build } = new AbilityBuilder<AppAbility>(createMongoAbility);
  if (!actor) return build();

  if (actor.system) {
    // Automatic moves only: a stock read makes a job ready, a log starts the review, a payment releases its hold
    // (resume, wherever the job was held from). Sending a revision is always a person's move, with their note.
    if (!actor.shopId) return build();
    can('transition', 'Job', ['ready', 'log_review'], { shopId: actor.shopId });
    can('transition', 'Job', [...OPEN_STATES], { shopId: actor.shopId, state: 'on_hold' });
    return build();
  }

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
      can('waive', 'Payment', inShop);
      break;
    case 'tuner': {
      // A tuner works on jobs assigned to them or not yet assigned.
      const inReach = { shopId, assignedTunerId: { $in: [me, null] } };
      can('read', 'Member', staffMember);
      can('read', 'Dealer', inShop);
      can(['read', 'create', 'update'], ['Customer', 'Vehicle'], inShop);
      can('create', 'Job', inShop);
      can(['read', 'update', 'upload', 'upload_revision', 'download'], 'Job', inReach);
      can('take', 'Job', { shopId, assignedTunerId: null });
      // Any tuner may open a job whose draft waits for a second person's approval, to review and approve it.
      can('read', 'Job', { shopId, awaitingApproval: true });
      // Shop steps for any tuner with the job in reach; the bench steps (send, revise again, dialed in) only for
      // the tuner it is assigned to.
      can('transition', 'Job', ['ready', 'log_review', 'on_hold'], inReach);
      can('transition', 'Job', 'on_bench', { ...inReach, state: 'ready' });
      can('transition', 'Job', [...OPEN_STATES], { ...inReach, state: 'on_hold' });
      can('transition', 'Job', ['on_bench', 'with_customer', 'dialed_in'], { shopId, assignedTunerId: me });
      can(['read', 'create'], 'Message', inShop);
      can('read', 'Payment', inShop);
      break;
    }
    case 'dealer': {
      const dealerId = actor.dealerId;
      if (!dealerId) break;
      const ofDealer = { shopId, dealerId };
      can('read', 'Dealer', { shopId, id: dealerId });
      can(['read', 'create', 'update'], ['Customer', 'Vehicle'], ofDealer);
      can(['read', 'create', 'upload', 'download'], 'Job', ofDealer);
      can('transition', 'Job', 'log_review', { ...ofDealer, state: 'with_customer' });
      can('transition', 'Job', 'cancelled', { ...ofDealer, state: 'intake' });
      can(['read', 'create'], 'Message', ofDealer);
      can('read', 'Ledger', ofDealer);
      can(['read', 'create'], 'Payment', ofDealer);
      break;
    }
    case 'customer': {
      const mine = { shopId, customerUserId: me };
      can(['read', 'create', 'update'], 'Vehicle', { shopId, ownerUserId: me });
      can(['read', 'create', 'upload', 'download'], 'Job', mine);
      // The customer sends their log in and may withdraw a job nobody has started.
      can('transition', 'Job', 'log_review', { ...mine, state: 'with_customer' });
      can('transition', 'Job', 'cancelled', { ...mine, state: 'intake' });
      can(['read', 'create'], 'Message', mine);
      can(['read', 'create'], 'Payment', mine);
      break;
    }
  }

  defineFileRules(can, actor, shopId);
  if (actor.role === 'owner' || actor.role === 'tuner') can('read', 'Approval', inShop);
  // Reports: how the shop is doing (money, each tuner's load) is the owner's view alone; reading stays open when read-only.
  if (actor.role === 'owner') can('read', 'Report', inShop);
  defineRentalRules(actor, shopId, can, cannot);

  if (actor.shopReadOnly) {
    // A suspended or lapsed shop keeps reading and downloading, and the owner can still pay to restore it.
    cannot(WRITE_ACTIONS, ['Member', 'Invitation', 'Dealer', 'Customer', 'Vehicle', 'Package', 'Job', 'Message', 'ShopSettings']);
    cannot('update', 'Shop');
    // Nor does it move money: no charge for work it cannot do now (job checkout), no dealer top-up or ledger entry,
    // no refund (docs/decisions/008). Only the owner's own payment to the platform (Subscription) stays open.
    cannot(WRITE_ACTIONS, ['Payment', 'Ledger']);
    cannot('approve', 'File');
  }
  return build();
}

/**
 * A calibration file as the File rules see it: its job's scope fields, plus whether it has reached the customer side
 * (`sent`: anything but a revision, or a revision whose round has started — a revision not sent is a draft), who
 * uploaded it, and whether it is a draft still waiting for the approval the shop asks for.
 */
export interface FileSubject {
  shopId: string;
  assignedTunerId: string | null;
  dealerId: string | null;
  customerUserId: string;
  /** The job has a draft waiting for approval, so any tuner of the shop may review its files. */
  awaitingApproval: boolean;
  kind: 'read' | 'revision' | 're_read';
  sent: boolean;
  uploadedByUserId: string;
  approvalPending: boolean;
}

/**
 * Who sees which file. The shop side sees every file of a job it may read and checks files against the revisions;
 * the dealer sees its customers' files once sent; the customer sees revisions once sent, and their own uploads. A
 * draft (a revision not sent) is the shop's alone: no customer or dealer rule matches it, on any route. A draft
 * waiting for approval is approved by another tuner or the owner, never by its uploader. Reading and checking write
 * nothing, so a read-only shop keeps both.
 */
function defineFileRules(can: AbilityBuilder<AppAbility>['can'], actor: Actor, shopId: string): void {
  const me = actor.userId;
  const approvable = { shopId, kind: 'revision', sent: false, approvalPending: true, uploadedByUserId: { $ne: me } };
  switch (actor.role) {
    case 'owner':
      can(['read', 'verify'], 'File', { shopId });
      can('approve', 'File', approvable);
      break;
    case 'tuner':
      can(['read', 'verify'], 'File', { shopId, assignedTunerId: { $in: [me, null] } });
      can('read', 'File', { shopId, awaitingApproval: true });
      can('approve', 'File', approvable);
      break;
    case 'dealer':
      if (actor.dealerId) can('read', 'File', { shopId, dealerId: actor.dealerId, sent: true });
      break;
    case 'customer':
      can('read', 'File', { shopId, customerUserId: me, sent: true, kind: 'revision' });
      can('read', 'File', { shopId, customerUserId: me, sent: true, uploadedByUserId: me });
      break;
  }
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
