import {
  findJob,
  findMembershipOfUser,
  findPackage,
  findUserByEmail,
  findVehicle,
  insertJob,
  insertJobMessage,
  insertMembership,
  insertUser,
  insertVehicle,
  vehicleColumns,
  listMembers,
  newId,
  nextJobNumber,
  updateJob,
  type Db,
  type JobListRow,
  type JobRow,
} from '@revloop/db';
import type { Job } from '@revloop/contract';
import { DomainError } from '@revloop/domain';
import { jobScopeFor, type Actor } from '@revloop/domain/auth';
import {
  JOB_STATE_LABELS,
  applyTransition,
  assertTransition,
  availableTransitions,
  nextStep,
  staleAfterHours,
  type JobFacts,
  type JobIntakeInput,
  type JobState,
} from '@revloop/domain/jobs';
import { logRequestFor, parseShopSettings } from '@revloop/domain/shops';
import type { VehicleInput } from '@revloop/domain/vehicles';
import type { AppDeps } from '../../context';
import type { AuthContext } from '../../http/auth-context';
import { recordAudit } from '../audit/audit.service';
import { assertJobRoom } from '../billing/plan-limits.service';
import { afterDealerDebit, debitDealerForJob } from '../billing/ledger.service';
import { notify, type NotificationKind } from '../notifications/notify.service';

export const factsOf = (row: JobRow): JobFacts => ({
  state: row.state,
  heldFrom: row.held_from,
  round: row.round,
  assignedTunerId: row.assigned_tuner_id,
  customerUserId: row.customer_user_id,
  dealerId: row.dealer_id,
  hasStockRead: row.has_stock_read === 1,
  hasRevisionForRound: row.has_revision_for_round === 1,
  hasLogForRound: row.has_log_for_round === 1,
});

/** The Job subject the ability checks: the camelCase fields its conditions name. */
export const jobSubject = (row: JobRow) => ({
  shopId: row.shop_id,
  assignedTunerId: row.assigned_tuner_id,
  dealerId: row.dealer_id,
  customerUserId: row.customer_user_id,
});

const audienceOf = (actor: Actor) => (actor.role === 'customer' ? 'customer' : actor.role === 'dealer' ? 'dealer' : 'shop');

/** API shape of a job for this viewer: what it is, where it stands, and what they can do next. */
export function jobRowToJob(row: JobListRow, actor: Actor, now: Date): Job {
  const facts = factsOf(row);
  const hoursInState = (now.getTime() - Date.parse(row.state_changed_at)) / 3_600_000;
  const staleAfter = staleAfterHours(row.state);
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
    facts: { hasStockRead: facts.hasStockRead, hasRevisionForRound: facts.hasRevisionForRound, hasLogForRound: facts.hasLogForRound },
    stateChangedAt: row.state_changed_at,
    hoursInState: Math.max(0, Math.round(hoursInState * 10) / 10),
    stale: staleAfter !== null && hoursInState > staleAfter,
    nextStep: nextStep(facts, audienceOf(actor)),
    transitions: availableTransitions(facts, actor),
    createdAt: row.created_at,
    updatedAt: row.updated_at,
  };
}
export type ApiJob = ReturnType<typeof jobRowToJob>;

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

/** Loads a job the signed-in user may see; anything else, in this shop or another, is a 404. */
export async function loadJob(db: Db, auth: AuthContext & { shop: { id: string } }, jobId: string): Promise<JobListRow> {
  const row = await findJob(db, auth.shop.id, jobId, jobScopeFor(auth.actor));
  if (!row) throw new DomainError('not_found', 'Job not found.');
  return row;
}

async function activeUserIds(db: Db, shopId: string, role: 'owner' | 'tuner' | 'dealer', dealerId?: string): Promise<string[]> {
  const rows = await listMembers(db, shopId, { role, ...(dealerId && { dealerId }) });
  return rows.filter((r) => r.status === 'active').map((r) => r.user_id);
}

/** The shop side of a job: its tuner, or every tuner when nobody has it yet, and the owners. */
export async function shopSideOf(db: Db, job: JobRow): Promise<string[]> {
  const owners = await activeUserIds(db, job.shop_id, 'owner');
  const tuners = job.assigned_tuner_id ? [job.assigned_tuner_id] : await activeUserIds(db, job.shop_id, 'tuner');
  return [...tuners, ...owners];
}

/** The customer side of a job: the customer and, for a dealer's customer, the dealer's users. */
export async function customerSideOf(db: Db, job: JobRow): Promise<string[]> {
  const dealerUsers = job.dealer_id ? await activeUserIds(db, job.shop_id, 'dealer', job.dealer_id) : [];
  return [job.customer_user_id, ...dealerUsers];
}

export const jobLink = (appOrigin: string, jobId: string) => `${appOrigin}/jobs/${jobId}`;

export const FLASH_CAUTIONS = [
  'Before you flash: connect a battery supporter, switch the ignition on with the engine off, and do not interrupt the write.',
  'Log only on a closed course or a dyno, obey the law, and keep your eyes on the road. Follow local rules and defer to licensed professionals.',
  'Calibration advice is advice to a tuner, not a guarantee.',
];

function logRequestLines(logRequestJson: string): string[] {
  const lr = JSON.parse(logRequestJson) as { channels?: string[]; warmupMinutes?: number; wotGears?: number; notes?: string };
  return [
    'Log request:',
    `- warm up about ${lr.warmupMinutes ?? 5} minutes, then pull ${lr.wotGears ?? 1} gear(s) at full throttle with the pedal on the floor`,
    `- channels: ${(lr.channels ?? []).join(', ')}`,
    ...(lr.notes ? [`- ${lr.notes}`] : []),
  ];
}

/** Who hears about a move, and what they are told. */
async function noticeForMove(db: Db, job: JobListRow, to: JobState) {
  const vehicle = job.vehicle_description;
  const ref = `Job ${job.number} (${vehicle})`;
  const plan: Array<{ kind: NotificationKind; recipients: string[]; title: string; body: string; emailLines?: string[] }> = [];
  if (to === 'with_customer') {
    plan.push({
      kind: 'revision_ready',
      recipients: await customerSideOf(db, job),
      title: `Revision ${job.round} is ready — ${ref}`,
      body: `Revision ${job.round} is ready to flash. Flash it, warm up, then log as requested.`,
      emailLines: ['', ...logRequestLines(job.log_request), '', ...FLASH_CAUTIONS],
    });
  } else if (to === 'log_review') {
    plan.push({ kind: 'log_received', recipients: await shopSideOf(db, job), title: `Log received — ${ref}`, body: `The log for revision ${job.round} is in and waiting for review.` });
  } else if (to === 'dialed_in') {
    plan.push({ kind: 'job_dialed_in', recipients: await customerSideOf(db, job), title: `Dialed in — ${ref}`, body: `Your calibration is finished: revision ${job.round} is the final one.` });
  } else {
    plan.push({
      kind: 'job_moved',
      recipients: [...(await customerSideOf(db, job)), ...(await shopSideOf(db, job))],
      title: `${ref} is now ${JOB_STATE_LABELS[to]}`,
      body: nextStep(factsOf(job), 'customer'),
    });
  }
  return plan;
}

/**
 * Moves a job: the domain decides whether the move is allowed, the update only lands if nobody moved it first.
 * `bySystem` is for moves that follow from an upload (a read makes the job ready, a log starts the review):
 * the person uploading may not make the move by hand, but its precondition is still checked.
 * `extraEmailLines` are added to the e-mails the move sends (e.g. signed download links for a revision).
 */
/** What moving a job needs: the API passes its deps, the demo seed its own clock and a mailer that sends nothing. */
export type JobFlowDeps = Pick<AppDeps, 'db' | 'clock' | 'mailer'> & { env: Pick<AppDeps['env'], 'APP_ORIGIN'> };

export async function moveJob(
  deps: JobFlowDeps,
  auth: AuthContext & { shop: { id: string } },
  jobId: string,
  to: JobState,
  options: { bySystem?: boolean; extraEmailLines?: string[] } = {},
): Promise<JobListRow> {
  const { db, clock } = deps;
  const job = await loadJob(db, auth, jobId);
  const facts = factsOf(job);
  const checker: Actor = options.bySystem ? { ...auth.actor, role: 'owner', dealerId: null } : auth.actor;
  assertTransition(facts, checker, to);
  const next = applyTransition(facts, to, options.bySystem ? undefined : auth.actor);
  const at = clock.now().toISOString();
  const updated = await updateJob(
    db,
    auth.shop.id,
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
  await recordAudit(db, {
    shopId: auth.shop.id,
    actorUserId: auth.user.id,
    action: 'job.moved',
    subjectType: 'Job',
    subjectId: job.id,
    details: { from: job.state, to, round: next.round, ...(options.bySystem && { automatic: true }) },
    at: clock.now(),
  });
  const fresh = (await findJob(db, auth.shop.id, job.id))!;
  for (const n of await noticeForMove(db, fresh, to)) {
    const emailLines = [...(n.emailLines ?? []), ...(options.extraEmailLines ? ['', ...options.extraEmailLines] : [])];
    await notify(db, deps.mailer, { shopId: auth.shop.id, jobId: job.id, link: jobLink(deps.env.APP_ORIGIN, job.id), at: clock.now(), ...n, emailLines }, auth.user.id);
  }
  return fresh;
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

/** Resolves who the job is for, creating a customer account (invited later) when the intake names a new one. */
async function resolveCustomer(db: Db, auth: AuthContext & { shop: { id: string } }, input: JobIntakeInput['customer'], at: string) {
  const actor = auth.actor;
  if (actor.role === 'customer') {
    if (input.kind !== 'existing' || input.customerUserId !== actor.userId) {
      throw new DomainError('validation', 'A customer opens jobs for themself.');
    }
    return { userId: actor.userId, dealerId: auth.membership?.dealer_id ?? null };
  }
  const dealerId = actor.role === 'dealer' ? actor.dealerId : null;
  if (input.kind === 'existing') {
    const membership = await findMembershipOfUser(db, auth.shop.id, input.customerUserId);
    if (!membership || membership.role !== 'customer' || membership.status !== 'active') {
      throw new DomainError('validation', 'Choose a customer of this shop.');
    }
    if (dealerId && membership.dealer_id !== dealerId) throw new DomainError('validation', 'Choose one of your own customers.');
    return { userId: membership.user_id, dealerId: membership.dealer_id };
  }
  const existing = await findUserByEmail(db, input.email);
  if (existing) {
    const membership = await findMembershipOfUser(db, auth.shop.id, existing.id);
    if (membership) throw new DomainError('conflict', 'This e-mail already belongs to someone in the shop: choose them from the list.');
  }
  const user = existing ?? (await insertUser(db, { id: newId(), email: input.email, name: input.name, password_hash: null, created_at: at }));
  await insertMembership(db, { id: newId(), shop_id: auth.shop.id, user_id: user.id, role: 'customer', dealer_id: dealerId, created_at: at });
  return { userId: user.id, dealerId, created: true as const };
}

async function resolveVehicle(db: Db, shopId: string, customer: { userId: string; dealerId: string | null }, input: JobIntakeInput['vehicle'], at: string) {
  if (input.kind === 'existing') {
    const vehicle = await findVehicle(db, shopId, input.vehicleId);
    if (!vehicle || vehicle.owner_user_id !== customer.userId) throw new DomainError('validation', 'Choose one of the customer’s vehicles.');
    return { id: vehicle.id, spec: JSON.parse(vehicle.spec) as VehicleInput };
  }
  const v = input.vehicle;
  const row = await insertVehicle(db, {
    id: newId(),
    shop_id: shopId,
    owner_user_id: customer.userId,
    dealer_id: customer.dealerId,
    ...vehicleColumns(v),
    created_at: at,
    updated_at: at,
  });
  return { id: row.id, spec: v };
}

/** Opens a job from the intake form, in one transaction, then tells both sides. */
export async function openJob(deps: AppDeps, auth: AuthContext & { shop: { id: string; settings: string; currency: string } }, input: JobIntakeInput): Promise<JobListRow> {
  const { db, clock } = deps;
  const at = clock.now().toISOString();
  const pkg = await findPackage(db, auth.shop.id, input.packageId);
  if (!pkg || pkg.active !== 1) throw new DomainError('validation', 'Choose one of the shop’s packages.');
  const settings = parseShopSettings(auth.shop.settings);
  await assertJobRoom(db, auth.shop.id, clock.now());
  const { jobId, debit } = await db.transaction().execute(async (trx) => {
    const customer = await resolveCustomer(trx, auth, input.customer, at);
    const vehicle = await resolveVehicle(trx, auth.shop.id, customer, input.vehicle, at);
    // A dealer's customer is paid wholesale from the dealer balance below; others may wait on hold for their payment.
    const holdForPayment = settings.holdUntilPaid && !customer.dealerId && pkg.retail_price_minor > 0;
    const job = await insertJob(trx, {
      id: newId(),
      shop_id: auth.shop.id,
      number: await nextJobNumber(trx, auth.shop.id),
      vehicle_id: vehicle.id,
      customer_user_id: customer.userId,
      dealer_id: customer.dealerId,
      package_id: pkg.id,
      assigned_tuner_id: null,
      state: holdForPayment ? 'on_hold' : 'intake',
      held_from: holdForPayment ? 'intake' : null,
      goals: input.goals,
      special_requests: JSON.stringify(input.specialRequests),
      log_request: JSON.stringify(logRequestFor(settings, vehicle.spec.engine.family, 1)),
      cautions_accepted_at: at,
      state_changed_at: at,
      created_by_user_id: auth.user.id,
      created_at: at,
      updated_at: at,
    });
    const debit = customer.dealerId
      ? await debitDealerForJob(trx, { shopId: auth.shop.id, currency: auth.shop.currency, dealerId: customer.dealerId, jobId: job.id, packageName: pkg.name, amountMinor: pkg.dealer_price_minor, userId: auth.user.id, at })
      : null;
    return { jobId: job.id, debit };
  });
  await afterDealerDebit(deps, auth.shop.id, debit);
  await recordAudit(db, { shopId: auth.shop.id, actorUserId: auth.user.id, action: 'job.opened', subjectType: 'Job', subjectId: jobId, at: clock.now() });
  const job = (await findJob(db, auth.shop.id, jobId))!;
  const link = jobLink(deps.env.APP_ORIGIN, job.id);
  const ref = `Job ${job.number} (${job.vehicle_description})`;
  await notify(db, deps.mailer, {
    shopId: auth.shop.id,
    jobId,
    kind: 'job_received',
    recipients: await customerSideOf(db, job),
    title: `We received your job — ${ref}`,
    body: `${auth.shop.name ?? 'The shop'} has your job for the ${job.package_name} package. Next: read the calibration off the vehicle and upload it as the stock read.`,
    emailLines: ['', ...FLASH_CAUTIONS],
    link,
    at: clock.now(),
  });
  await notify(
    db,
    deps.mailer,
    { shopId: auth.shop.id, jobId, kind: 'job_received', recipients: await shopSideOf(db, job), title: `New job — ${ref}`, body: `${job.customer_name} opened a job for the ${job.package_name} package.`, link, at: clock.now() },
    auth.user.id,
  );
  return job;
}

export async function assignJob(deps: AppDeps, auth: AuthContext & { shop: { id: string } }, jobId: string, tunerId: string | null): Promise<JobListRow> {
  const { db, clock } = deps;
  const job = await loadJob(db, auth, jobId);
  if (tunerId) {
    const membership = await findMembershipOfUser(db, auth.shop.id, tunerId);
    if (!membership || membership.role !== 'tuner' || membership.status !== 'active') throw new DomainError('validation', 'Choose an active tuner of this shop.');
  }
  await updateJob(db, auth.shop.id, job.id, { assigned_tuner_id: tunerId, updated_at: clock.now().toISOString() });
  await recordAudit(db, { shopId: auth.shop.id, actorUserId: auth.user.id, action: 'job.assigned', subjectType: 'Job', subjectId: job.id, details: { tunerId }, at: clock.now() });
  if (tunerId) {
    await notify(db, deps.mailer, { shopId: auth.shop.id, jobId, kind: 'job_moved', recipients: [tunerId], title: `Job ${job.number} is yours`, body: `You were assigned job ${job.number} (${job.vehicle_description}).`, link: jobLink(deps.env.APP_ORIGIN, job.id), at: clock.now() }, auth.user.id);
  }
  return (await findJob(db, auth.shop.id, job.id))!;
}

/** A tuner takes an unassigned job; the `where` makes two tuners taking it at once safe. */
export async function takeJob(deps: JobFlowDeps, auth: AuthContext & { shop: { id: string } }, jobId: string): Promise<JobListRow> {
  const { db, clock } = deps;
  const job = await loadJob(db, auth, jobId);
  if (job.assigned_tuner_id) throw new DomainError('conflict', 'This job already has a tuner.');
  const taken = await db
    .updateTable('jobs')
    .set({ assigned_tuner_id: auth.user.id, updated_at: clock.now().toISOString() })
    .where('shop_id', '=', auth.shop.id)
    .where('id', '=', job.id)
    .where('assigned_tuner_id', 'is', null)
    .executeTakeFirst();
  if (Number(taken.numUpdatedRows) !== 1) throw new DomainError('conflict', 'Another tuner just took this job.');
  await recordAudit(db, { shopId: auth.shop.id, actorUserId: auth.user.id, action: 'job.taken', subjectType: 'Job', subjectId: job.id, at: clock.now() });
  return (await findJob(db, auth.shop.id, job.id))!;
}

/** Posts a message on a job and tells the other side (the shop, or the customer and their dealer). */
export async function postJobMessage(deps: JobFlowDeps, auth: AuthContext & { shop: { id: string } }, job: JobListRow, body: string) {
  const { db, clock } = deps;
  const message = await insertJobMessage(db, { id: newId(), shop_id: auth.shop.id, job_id: job.id, author_user_id: auth.user.id, body, created_at: clock.now().toISOString() });
  const fromShop = auth.actor.role === 'owner' || auth.actor.role === 'tuner';
  await notify(
    db,
    deps.mailer,
    {
      shopId: auth.shop.id,
      jobId: job.id,
      kind: 'message_received',
      recipients: fromShop ? await customerSideOf(db, job) : await shopSideOf(db, job),
      title: `Message from ${auth.user.name} — job ${job.number}`,
      body: body.length > 280 ? `${body.slice(0, 277)}…` : body,
      link: jobLink(deps.env.APP_ORIGIN, job.id),
      at: clock.now(),
    },
    auth.user.id,
  );
  return message;
}
