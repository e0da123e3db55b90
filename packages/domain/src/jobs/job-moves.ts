import { asSubject, defineAbilityFor, type AppAbility } from '../auth/ability';
import type { Actor } from '../auth/roles';
import { DomainError } from '../errors';
import { assertGuard, movesFrom, moveTo, type AvailableTransition, type JobFacts } from './job-machine';
import { JOB_STATE_LABELS, type JobState } from './job-states';

/**
 * The one place the state machine (which moves exist, what each needs) meets the abilities (who may make it):
 * the buttons the UI shows and the check the server makes both come from here, so they cannot disagree.
 */

/** The Job subject a move is checked against: the fields the `transition` rules name, current state included. */
export const jobMoveSubject = (facts: JobFacts) =>
  asSubject('Job', {
    shopId: facts.shopId,
    state: facts.state,
    assignedTunerId: facts.assignedTunerId,
    customerUserId: facts.customerUserId,
    dealerId: facts.dealerId,
  });

/** Moves this actor can make now: ones the machine has, the ability allows and whose precondition is met. */
export function availableTransitions(facts: JobFacts, ability: AppAbility): AvailableTransition[] {
  const subject = jobMoveSubject(facts);
  return movesFrom(facts)
    .filter((move) => ability.can('transition', subject, move.to) && (move.guard?.(facts) ?? null) === null)
    .map(({ to, label, needsNote }) => ({ to, label, ...(needsNote && { needsNote }) }));
}

/** Throws 'validation' when the move to `to` needs a "what changed" note and none was given. */
export function assertMoveNote(facts: JobFacts, to: JobState, note: string | null | undefined): void {
  if (moveTo(facts, to).needsNote && !note?.trim()) {
    throw new DomainError('validation', 'Say what changed in this revision: the customer reads the note with the download.');
  }
}

/**
 * Throws unless `actor` may move the job to `to` now: 'invalid_transition' for a move the job cannot make (or
 * whose precondition is unmet), 'shop_read_only' in a read-only shop, 'forbidden' for a move this actor may not
 * make. Pass the actor's ability when it is already built.
 */
export function assertTransition(
  facts: JobFacts,
  actor: Actor,
  to: JobState,
  ability: AppAbility = defineAbilityFor(actor),
): void {
  const move = moveTo(facts, to);
  if (!ability.can('transition', jobMoveSubject(facts), to)) {
    if (actor.shopReadOnly) {
      throw new DomainError('shop_read_only', 'This shop is read-only, so its jobs cannot be moved.');
    }
    throw new DomainError(
      'forbidden',
      actor.role === null && !actor.system
        ? 'Only members of the shop can move its jobs.'
        : `You may not move this job from ${JOB_STATE_LABELS[facts.state]} to ${JOB_STATE_LABELS[to]}.`,
    );
  }
  assertGuard(move, facts);
}
