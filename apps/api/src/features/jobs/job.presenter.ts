import type { Job } from '@revloop/contract';
import type { JobListRow, JobMessageListRow, JobRow } from '@revloop/db';
import type { Actor, AppAbility } from '@revloop/domain/auth';
import { JOB_STATE_LABELS, availableTransitions, nextStep, nextStepAction, staleAfterHours, type JobFacts } from '@revloop/domain/jobs';

export const factsOf = (row: JobRow): JobFacts => ({
  shopId: row.shop_id,
  state: row.state,
  heldFrom: row.held_from,
  round: row.round,
  assignedTunerId: row.assigned_tuner_id,
  customerUserId: row.customer_user_id,
  dealerId: row.dealer_id,
  hasStockRead: row.has_stock_read === 1,
  hasRevisionForRound: row.has_revision_for_round === 1,
  awaitingApproval: row.drafts_awaiting_approval > 0,
  hasLogForRound: row.has_log_for_round === 1,
});

/** The Job subject the ability checks: the camelCase fields its conditions name. */
export const jobSubject = (row: JobRow) => ({
  shopId: row.shop_id,
  state: row.state,
  assignedTunerId: row.assigned_tuner_id,
  dealerId: row.dealer_id,
  customerUserId: row.customer_user_id,
  awaitingApproval: row.drafts_awaiting_approval > 0,
});

const audienceOf = (actor: Actor) => (actor.role === 'customer' ? 'customer' : actor.role === 'dealer' ? 'dealer' : 'shop');

const NO_LOCKS: ReadonlySet<string> = new Set();

/**
 * API shape of a job for this viewer: what it is, where it stands, and what they can do next. `lockedJobIds` names the
 * customer's jobs whose sent revisions wait, locked until paid (billing's lockedJobIdsForCustomer): their next step
 * says to pay first.
 */
export function jobRowToJob(row: JobListRow, viewer: { actor: Actor; ability: AppAbility }, now: Date, lockedJobIds: ReadonlySet<string> = NO_LOCKS): Job {
  const facts = factsOf(row);
  const audience = audienceOf(viewer.actor);
  const stepContext = { revisionsLocked: lockedJobIds.has(row.id) };
  const hoursInState = (now.getTime() - Date.parse(row.state_changed_at)) / 3_600_000;
  const staleAfter = staleAfterHours(row.state);
  // Drafts are the shop's alone: the customer side learns nothing of them, not even that one is uploaded.
  const shopSide = audience === 'shop';
  return {
    id: row.id,
    number: row.number,
    state: row.state,
    stateLabel: JOB_STATE_LABELS[row.state],
    heldFrom: row.held_from,
    round: row.round,
    vehicle: { id: row.vehicle_id, description: row.vehicle_description, vin: row.vehicle_vin, modelYear: row.vehicle_model_year },
    customer: { id: row.customer_user_id, name: row.customer_name, email: row.customer_email },
    dealer: row.dealer_id ? { id: row.dealer_id, name: row.dealer_name } : null,
    package: { id: row.package_id, name: row.package_name },
    tuner: row.assigned_tuner_id ? { id: row.assigned_tuner_id, name: row.tuner_name } : null,
    goals: row.goals,
    specialRequests: JSON.parse(row.special_requests) as Job['specialRequests'],
    logRequest: JSON.parse(row.log_request) as Job['logRequest'],
    facts: { hasStockRead: facts.hasStockRead, hasRevisionForRound: shopSide && facts.hasRevisionForRound, hasLogForRound: facts.hasLogForRound },
    draftsAwaitingApproval: shopSide ? row.drafts_awaiting_approval : 0,
    stateChangedAt: row.state_changed_at,
    hoursInState: Math.max(0, Math.round(hoursInState * 10) / 10),
    stale: staleAfter !== null && hoursInState > staleAfter,
    nextStep: nextStep(facts, audience, stepContext),
    nextStepAction: nextStepAction(facts, audience, stepContext),
    // The same machine moves filtered by the same ability the server checks a move against (domain job-moves.ts).
    transitions: availableTransitions(facts, viewer.ability),
    createdAt: row.created_at,
    updatedAt: row.updated_at,
  };
}
export type ApiJob = Job;

/**
 * The first moment (epoch ms) at which `jobRowToJob` would answer differently for this row with nothing written:
 * its rounded hours in state tick every six minutes and it turns stale once past its state's limit.
 */
export function jobAnswerChangesAt(row: Pick<JobRow, 'state' | 'state_changed_at'>, now: Date): number {
  const changed = Date.parse(row.state_changed_at);
  const tenths = (now.getTime() - changed) / 360_000;
  // Math.round moves to the next tenth when the tenths pass the next half; a millisecond early stays on the safe side.
  let at = changed + (Math.floor(tenths + 0.5) + 0.5) * 360_000 - 1;
  const staleAfter = staleAfterHours(row.state);
  if (staleAfter !== null) {
    const staleAt = changed + staleAfter * 3_600_000;
    if (staleAt >= now.getTime()) at = Math.min(at, staleAt);
  }
  return at;
}

/** API shape of a message on a job, as `viewerId` sees it. */
export const jobMessageToApi = (m: Pick<JobMessageListRow, 'id' | 'body' | 'author_user_id' | 'author_name' | 'created_at'>, viewerId: string) => ({
  id: m.id,
  body: m.body,
  author: { id: m.author_user_id, name: m.author_name },
  mine: m.author_user_id === viewerId,
  createdAt: m.created_at,
});
