import { DomainError } from '../errors';

/** The platform bills every shop in one currency, whatever currency the shop sells in. */
export const PLATFORM_CURRENCY = 'USD';
/** New shops (signed up or created by a platform admin) try Revloop for this long before paying. */
export const TRIAL_DAYS = 14;
/** A failed renewal leaves the shop writable this long, so a card problem does not stop the bench at once. */
export const PAST_DUE_GRACE_DAYS = 7;

export const PLAN_IDS = ['solo', 'workshop', 'fleet'] as const;
export type PlanId = (typeof PLAN_IDS)[number];

export interface Plan {
  id: PlanId;
  name: string;
  /** Monthly price of one tuner seat, in minor units of PLATFORM_CURRENCY. */
  seatPriceMinor: number;
  minSeats: number;
  maxSeats: number;
  /** Jobs a shop may open per calendar month on this plan. */
  jobsPerMonth: number;
  summary: string;
}

/** Seats count the people who work the bench: owners and tuners. */
export const PLANS: readonly Plan[] = [
  { id: 'solo', name: 'Solo', seatPriceMinor: 5900, minSeats: 1, maxSeats: 1, jobsPerMonth: 40, summary: 'One tuner who runs the shop.' },
  { id: 'workshop', name: 'Workshop', seatPriceMinor: 4900, minSeats: 2, maxSeats: 6, jobsPerMonth: 200, summary: 'A small team with a dealer or two.' },
  { id: 'fleet', name: 'Fleet', seatPriceMinor: 3900, minSeats: 5, maxSeats: 30, jobsPerMonth: 1000, summary: 'Several benches and a dealer network.' },
];

/** The plan a new shop tries during its trial. */
export const TRIAL_PLAN: PlanId = 'workshop';

export function planById(id: string): Plan {
  const plan = PLANS.find((p) => p.id === id);
  if (!plan) throw new DomainError('validation', `"${id}" is not a plan. Choose ${PLANS.map((p) => p.name).join(', ')}.`);
  return plan;
}

/** Monthly amount of a plan at a seat count, in minor units. */
export const monthlyAmountMinor = (plan: Plan, seats: number): number => plan.seatPriceMinor * seats;

/** Checks a plan change against the plan's seat range and the people already on the bench. */
export function assertPlanChoice(plan: Plan, seats: number, seatsInUse: number): void {
  if (!Number.isInteger(seats) || seats < plan.minSeats || seats > plan.maxSeats) {
    const range = plan.minSeats === plan.maxSeats ? `exactly ${plan.minSeats}` : `${plan.minSeats} to ${plan.maxSeats}`;
    throw new DomainError('validation', `${plan.name} has ${range} tuner seat${plan.maxSeats === 1 ? '' : 's'}.`);
  }
  if (seats < seatsInUse) {
    throw new DomainError(
      'validation',
      `Your shop has ${seatsInUse} owners and tuners; choose at least ${seatsInUse} seats or deactivate a member first.`,
    );
  }
}
