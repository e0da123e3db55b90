import { DomainError } from '../errors';
import type { Plan } from './plans';

/** Seats a shop may fill: its paid seats, or the plan's maximum while it tries the plan. */
export const seatLimit = (plan: Plan, seats: number, trialing: boolean): number => (trialing ? plan.maxSeats : seats);

/** Refuses one more owner or tuner when every seat is taken (pending invitations hold a seat too). */
export function assertSeatAvailable(plan: Plan, seats: number, trialing: boolean, seatsTaken: number): void {
  const limit = seatLimit(plan, seats, trialing);
  if (seatsTaken + 1 > limit) {
    throw new DomainError(
      'payment_required',
      `All ${limit} tuner seat${limit === 1 ? '' : 's'} of the ${plan.name} plan are taken. The owner can add seats on the Billing page, or deactivate someone first.`,
    );
  }
}

/** Refuses a new job once this calendar month's volume of the plan is used. */
export function assertJobVolume(plan: Plan, jobsThisMonth: number): void {
  if (jobsThisMonth + 1 > plan.jobsPerMonth) {
    throw new DomainError(
      'payment_required',
      `This month's ${plan.jobsPerMonth} jobs of the ${plan.name} plan are used. The owner can move to a larger plan on the Billing page.`,
    );
  }
}
