import type { Actor } from '../auth/roles';
import { KIT_AWAY_STATES, type RentalState } from './rental-states';

/**
 * The dialed-in guard for jobs with a rented kit (issue 14): a job cannot be marked dialed in while its kit is still
 * away from the shop, unless the owner says so (`kitOutOverride`). Written apart from the job machine so it can be
 * folded into the job workflow's `log_review → dialed_in` guard; null when the move may go ahead.
 */
export function kitOutBlock(rentalStates: readonly RentalState[], actor: Actor, kitOutOverride: boolean): string | null {
  const away = rentalStates.some((s) => (KIT_AWAY_STATES as readonly RentalState[]).includes(s));
  if (!away) return null;
  if (kitOutOverride && actor.role === 'owner') return null;
  return kitOutOverride
    ? 'Only the owner can mark the job dialed in while its rental kit is still out.'
    : 'The rental kit is still out: have it returned first, or the owner can mark the job dialed in anyway.';
}
