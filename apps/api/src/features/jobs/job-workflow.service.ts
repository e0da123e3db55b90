import { findJob, findMembershipOfUser, inTransaction, insertJobStint, listRentals, markRevisionsSent, updateJob, type Db, type JobListRow } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import { systemActorFor, type Actor, type AppAbility } from '@revloop/domain/auth';
import type { LogRequest } from '@revloop/domain/datalog';
import { applyTransition, assertMoveNote, assertTransition, type JobFacts, type JobState } from '@revloop/domain/jobs';
import { kitOutBlock } from '@revloop/domain/rentals';
import type { AppDeps } from '../../context';
import type { AuthContext } from '../../http/auth-context';
import { recordAudit } from '../audit/audit.service';
import { drainMailOutbox } from '../mail/mail-outbox.service';
import { notify } from '../notifications/notify.service';
import { factsOf } from './job.presenter';
import { jobLink, loadJob } from './job-lookup.service';
import { noticesForMove } from './job-notices';

/** What moving a job needs: the API passes its deps, the demo seed its own clock and a mailer that sends nothing. */
export type JobFlowDeps = Pick<AppDeps, 'db' | 'clock' | 'mailer'> & { env: Pick<AppDeps['env'], 'APP_ORIGIN'> };
type ShopAuth = AuthContext & { shop: { id: string } };

/** Who makes a move: a shop member with their ability, or the system actor; `causedBy` is left out of the notices. */
export interface Mover {
  actor: Actor;
  ability?: AppAbility;
  causedBy: string | null;
}

/**
 * The one writer of a job's state. In the caller's transaction: checks the actor's ability and the machine's guard
 * (domain `assertTransition`), updates the row only if nobody moved it first, writes the audit event and the stint the
 * move ends (job_stints, read by the reports) and queues the notices (in-app and e-mail). Callers drain the mail
 * outbox after their commit.
 */
export async function transitionJob(
  deps: JobFlowDeps,
  trx: Db,
  job: JobListRow,
  to: JobState,
  mover: Mover,
  options: MoveOptions & { auditText?: string } = {},
): Promise<JobListRow> {
  const { clock } = deps;
  const { actor } = mover;
  const facts = factsOf(job);
  assertTransition(facts, actor, to, mover.ability);
  assertMoveNote(facts, to, options.note);
  if (to === 'dialed_in') {
    // A rented kit still away from the shop holds the job open unless the owner says otherwise.
    const rentals = await listRentals(trx, job.shop_id, { kind: 'shop' }, { jobId: job.id });
    const blocked = kitOutBlock(rentals.map((r) => r.state), actor, options.kitOutOverride ?? false);
    if (blocked) throw new DomainError('invalid_transition', blocked);
  }
  const next = applyTransition(facts, to, actor);
  // Only Send revision (the move that starts a round) carries a note.
  const note = next.round > facts.round ? options.note?.trim() : undefined;
  const at = clock.now().toISOString();
  const updated = await updateJob(
    trx,
    job.shop_id,
    job.id,
    {
      state: next.state,
      held_from: next.heldFrom,
      round: next.round,
      assigned_tuner_id: next.assignedTunerId,
      has_revision_for_round: next.hasRevisionForRound ? 1 : 0,
      has_log_for_round: next.hasLogForRound ? 1 : 0,
      state_changed_at: at,
      updated_at: at,
    },
    job.state,
  );
  if (!updated) throw new DomainError('conflict', 'Someone else just moved this job. Reload and try again.');
  // Send revision: the drafts of the round it starts go out, each carrying the note the customer reads.
  if (note) await markRevisionsSent(trx, job.shop_id, job.id, next.round, note, at);
  const moveEventId = await recordAudit(trx, {
    shopId: job.shop_id,
    // The system actor is nobody: the timeline shows its moves as Revloop's.
    actorUserId: actor.system ? null : actor.userId,
    action: 'job.moved',
    subjectType: 'Job',
    subjectId: job.id,
    details: { from: job.state, to, round: next.round, ...(actor.system && { automatic: true }), ...(note && { note }), ...(options.auditText && { text: options.auditText }) },
    at: clock.now(),
  });
  // The stint the move ends, for the reports' time in each state: begun when the job last changed state, ended now.
  await insertJobStint(trx, {
    id: moveEventId,
    shop_id: job.shop_id,
    job_id: job.id,
    state: job.state,
    entered_at: job.state_changed_at,
    left_at: at,
    to_state: to,
    round: next.round,
    left_by_user_id: actor.system ? null : actor.userId,
  });
  const fresh = (await findJob(trx, job.shop_id, job.id))!;
  for (const n of await noticesForMove(trx, fresh, to, note)) {
    const emailLines = [...(n.emailLines ?? []), ...(options.extraEmailLines ? ['', ...options.extraEmailLines] : [])];
    await notify(trx, { shopId: job.shop_id, jobId: job.id, link: jobLink(deps.env.APP_ORIGIN, job.id), at: clock.now(), ...n, emailLines }, mover.causedBy);
  }
  return fresh;
}

/** `note` is the "what changed" note Send revision needs; `extraEmailLines` are added to the e-mails the move sends. */
export interface MoveOptions {
  extraEmailLines?: string[];
  kitOutOverride?: boolean;
  note?: string;
}

/**
 * Moves a job the signed-in user can see, in one transaction, then sends the mail it queued. `bySystem` is for
 * moves that follow from what they did (a read makes the job ready, a log starts the review): the system actor
 * makes those, under its own abilities, with the move's precondition still checked. `extraEmailLines` are added
 * to the e-mails the move sends (e.g. signed download links for a revision).
 */
export async function moveJob(
  deps: JobFlowDeps,
  auth: ShopAuth,
  jobId: string,
  to: JobState,
  options: MoveOptions & { bySystem?: boolean } = {},
): Promise<JobListRow> {
  const mover: Mover = options.bySystem
    ? { actor: systemActorFor(auth.shop.id), causedBy: auth.user.id }
    : { actor: auth.actor, ability: auth.ability, causedBy: auth.user.id };
  const moved = await inTransaction(deps.db, async (trx) => transitionJob(deps, trx, await loadJob(trx, auth, jobId), to, mover, options));
  await drainMailOutbox(deps);
  return moved;
}

/** Records what the vault and the log upload learned (a stock read is in, a revision or a log for the round). */
export async function setJobFacts(
  db: Db,
  shopId: string,
  jobId: string,
  facts: Partial<Pick<JobFacts, 'hasStockRead' | 'hasRevisionForRound' | 'hasLogForRound'>>,
  at: Date,
): Promise<void> {
  const bit = (v: boolean | undefined) => (v === undefined ? undefined : v ? 1 : 0);
  await updateJob(db, shopId, jobId, {
    ...(facts.hasStockRead !== undefined && { has_stock_read: bit(facts.hasStockRead) }),
    ...(facts.hasRevisionForRound !== undefined && { has_revision_for_round: bit(facts.hasRevisionForRound) }),
    ...(facts.hasLogForRound !== undefined && { has_log_for_round: bit(facts.hasLogForRound) }),
    updated_at: at.toISOString(),
  });
}

export async function assignJob(deps: JobFlowDeps, auth: ShopAuth, jobId: string, tunerId: string | null): Promise<JobListRow> {
  const { clock } = deps;
  const assigned = await inTransaction(deps.db, async (trx) => {
    const job = await loadJob(trx, auth, jobId);
    if (tunerId) {
      const membership = await findMembershipOfUser(trx, auth.shop.id, tunerId);
      if (!membership || membership.role !== 'tuner' || membership.status !== 'active') throw new DomainError('validation', 'Choose an active tuner of this shop.');
    }
    await updateJob(trx, auth.shop.id, job.id, { assigned_tuner_id: tunerId, updated_at: clock.now().toISOString() });
    await recordAudit(trx, { shopId: auth.shop.id, actorUserId: auth.user.id, action: 'job.assigned', subjectType: 'Job', subjectId: job.id, details: { tunerId }, at: clock.now() });
    if (tunerId) {
      await notify(trx, { shopId: auth.shop.id, jobId, kind: 'job_moved', recipients: [tunerId], title: `Job ${job.number} is yours`, body: `You were assigned job ${job.number} (${job.vehicle_description}).`, link: jobLink(deps.env.APP_ORIGIN, job.id), at: clock.now() }, auth.user.id);
    }
    return (await findJob(trx, auth.shop.id, job.id))!;
  });
  await drainMailOutbox(deps);
  return assigned;
}

/** A tuner takes an unassigned job; the `where` makes two tuners taking it at once safe. */
export async function takeJob(deps: JobFlowDeps, auth: ShopAuth, jobId: string): Promise<JobListRow> {
  const { clock } = deps;
  return inTransaction(deps.db, async (trx) => {
    const job = await loadJob(trx, auth, jobId);
    if (job.assigned_tuner_id) throw new DomainError('conflict', 'This job already has a tuner.');
    const taken = await trx
      .updateTable('jobs')
      .set({ assigned_tuner_id: auth.user.id, updated_at: clock.now().toISOString() })
      .where('shop_id', '=', auth.shop.id)
      .where('id', '=', job.id)
      .where('assigned_tuner_id', 'is', null)
      .executeTakeFirst();
    if (Number(taken.numUpdatedRows) !== 1) throw new DomainError('conflict', 'Another tuner just took this job.');
    await recordAudit(trx, { shopId: auth.shop.id, actorUserId: auth.user.id, action: 'job.taken', subjectType: 'Job', subjectId: job.id, at: clock.now() });
    return (await findJob(trx, auth.shop.id, job.id))!;
  });
}

/** Replaces the job's log request (what the customer is asked to log next) and records who changed it. */
export async function changeLogRequest(deps: JobFlowDeps, auth: ShopAuth, job: JobListRow, logRequest: LogRequest): Promise<JobListRow> {
  const { clock } = deps;
  return inTransaction(deps.db, async (trx) => {
    await updateJob(trx, auth.shop.id, job.id, { log_request: JSON.stringify(logRequest), updated_at: clock.now().toISOString() });
    await recordAudit(trx, { shopId: auth.shop.id, actorUserId: auth.user.id, action: 'job.log_request_changed', subjectType: 'Job', subjectId: job.id, at: clock.now() });
    return (await findJob(trx, auth.shop.id, job.id))!;
  });
}
