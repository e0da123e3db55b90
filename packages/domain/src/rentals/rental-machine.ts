import type { Actor } from '../auth/roles';
import { DomainError } from '../errors';
import { RENTAL_STATE_LABELS, type KitStatus, type RentalState } from './rental-states';

/** What the rental machine needs to know; the API derives it from the rental and job rows. */
export interface RentalFacts {
  state: RentalState;
  kitId: string | null;
  customerUserId: string;
  dealerId: string | null;
  termsAccepted: boolean;
  feePaid: boolean;
  /** A deposit is due (the kit's deposit is above zero). */
  depositDue: boolean;
  /** The card the deposit is held on is saved (setup-mode Checkout completed). */
  cardSaved: boolean;
}

type Who = 'owner' | 'tuner' | 'job_customer' | 'job_dealer';

interface Move {
  from: readonly RentalState[];
  to: RentalState;
  label: string;
  who: readonly Who[];
  /** Null when the move can be made now, else the reason it cannot. */
  guard?: (facts: RentalFacts) => string | null;
}

const STAFF: readonly Who[] = ['owner', 'tuner'];
const EVERYONE_ON_JOB: readonly Who[] = ['owner', 'tuner', 'job_customer', 'job_dealer'];

/** The rental workflow as data: every move, who may make it, and what must be true first. */
export const RENTAL_MOVES: readonly Move[] = [
  { from: ['requested'], to: 'booked', label: 'Book the kit', who: STAFF },
  {
    from: ['booked'],
    to: 'shipped',
    label: 'Mark shipped',
    who: STAFF,
    guard: (f) => {
      if (f.kitId === null) return 'Pick a kit first.';
      if (!f.termsAccepted) return 'The customer has not agreed to the rental terms yet.';
      if (!f.feePaid) return 'The rental fee is not paid yet.';
      if (f.depositDue && !f.cardSaved) return 'The customer has not saved the card for the deposit hold yet.';
      return null;
    },
  },
  { from: ['shipped'], to: 'with_customer', label: 'Kit arrived', who: EVERYONE_ON_JOB },
  { from: ['shipped', 'with_customer'], to: 'returned', label: 'Kit received back', who: STAFF },
  { from: ['returned'], to: 'closed', label: 'Settle and close', who: ['owner'] },
  { from: ['requested'], to: 'cancelled', label: 'Cancel request', who: EVERYONE_ON_JOB },
  { from: ['booked'], to: 'cancelled', label: 'Cancel booking', who: STAFF },
];

export interface AvailableRentalMove {
  to: RentalState;
  label: string;
}

function actorIs(who: Who, facts: RentalFacts, actor: Actor): boolean {
  switch (who) {
    case 'owner':
      return actor.role === 'owner';
    case 'tuner':
      return actor.role === 'tuner';
    case 'job_customer':
      return actor.role === 'customer' && actor.userId === facts.customerUserId;
    case 'job_dealer':
      return actor.role === 'dealer' && actor.dealerId !== null && actor.dealerId === facts.dealerId;
  }
}

function actorBlock(actor: Actor): DomainError | null {
  if (actor.platformAdmin || actor.role === null) {
    return new DomainError('forbidden', 'Only members of the shop can move its rentals.');
  }
  if (actor.shopReadOnly) return new DomainError('shop_read_only', 'This shop is read-only, so its rentals cannot be moved.');
  return null;
}

const movesFrom = (state: RentalState) => RENTAL_MOVES.filter((m) => m.from.includes(state));
const mayMake = (move: Move, facts: RentalFacts, actor: Actor) =>
  actorBlock(actor) === null && move.who.some((who) => actorIs(who, facts, actor));

/** Moves this actor may make now, with every guard met. */
export function availableRentalMoves(facts: RentalFacts, actor: Actor): AvailableRentalMove[] {
  return movesFrom(facts.state)
    .filter((m) => mayMake(m, facts, actor) && (m.guard?.(facts) ?? null) === null)
    .map(({ to, label }) => ({ to, label }));
}

/** Throws 'invalid_transition' (no such move, or a guard unmet), 'forbidden' or 'shop_read_only'. */
export function assertRentalMove(facts: RentalFacts, actor: Actor, to: RentalState): void {
  const from = RENTAL_STATE_LABELS[facts.state];
  const move = movesFrom(facts.state).find((m) => m.to === to);
  if (!move) throw new DomainError('invalid_transition', `A rental that is ${from.toLowerCase()} cannot move to ${RENTAL_STATE_LABELS[to].toLowerCase()}.`);
  const blocked = actorBlock(actor);
  if (blocked) throw blocked;
  if (!mayMake(move, facts, actor)) {
    throw new DomainError('forbidden', `You may not move this rental from ${from.toLowerCase()} to ${RENTAL_STATE_LABELS[to].toLowerCase()}.`);
  }
  const unmet = move.guard?.(facts) ?? null;
  if (unmet !== null) throw new DomainError('invalid_transition', unmet);
}

/**
 * The kit's status after a rental moves to `to`. A kit in repair, inspection or retired keeps its status when
 * booked ahead; closing leaves it in inspection until the owner marks it available or in repair.
 */
export function kitStatusAfterMove(current: KitStatus, to: RentalState, otherBookings: number): KitStatus {
  switch (to) {
    case 'booked':
      return current === 'available' ? 'booked' : current;
    case 'shipped':
    case 'with_customer':
      return 'out';
    case 'returned':
      return 'in_inspection';
    case 'cancelled':
      return current === 'booked' && otherBookings === 0 ? 'available' : current;
    default:
      return current;
  }
}
