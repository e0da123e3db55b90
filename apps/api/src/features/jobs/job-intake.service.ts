import {
  findJob,
  findMembershipOfUser,
  findPackage,
  findUserByEmail,
  findVehicle,
  inTransaction,
  insertJob,
  insertMembership,
  insertUser,
  insertVehicle,
  vehicleColumns,
  newId,
  nextJobNumber,
  type Db,
  type JobListRow,
} from '@revloop/db';
import { DomainError } from '@revloop/domain';
import type { JobIntakeInput } from '@revloop/domain/jobs';
import { rentalSettings } from '@revloop/domain/rentals';
import { logRequestFor, parseShopSettings } from '@revloop/domain/shops';
import type { VehicleInput } from '@revloop/domain/vehicles';
import type { AppDeps } from '../../context';
import type { AuthContext } from '../../http/auth-context';
import { recordAudit } from '../audit/audit.service';
import { assertJobRoom } from '../billing/plan-limits.service';
import { afterDealerDebit, debitDealerForJob } from '../billing/ledger.service';
import { drainMailOutbox } from '../mail/mail-outbox.service';
import { notify } from '../notifications/notify.service';
import { insertRentalRequest } from '../rentals/rental-request';
import { customerSideOf, jobLink, shopSideOf } from './job-lookup.service';
import { FLASH_CAUTIONS } from './job-notices';

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
  // The job, its audit event and its notices commit together; the queued mail goes out after.
  const { job, debit } = await inTransaction(db, async (trx) => {
    const customer = await resolveCustomer(trx, auth, input.customer, at);
    const vehicle = await resolveVehicle(trx, auth.shop.id, customer, input.vehicle, at);
    // A dealer's customer is paid wholesale from the dealer balance below; others may wait on hold for their payment.
    const holdForPayment = settings.holdUntilPaid && !customer.dealerId && pkg.retail_price_minor > 0;
    const inserted = await insertJob(trx, {
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
      ? await debitDealerForJob(trx, { shopId: auth.shop.id, currency: auth.shop.currency, dealerId: customer.dealerId, jobId: inserted.id, packageName: pkg.name, amountMinor: pkg.dealer_price_minor, userId: auth.user.id, at })
      : null;
    await recordAudit(trx, { shopId: auth.shop.id, actorUserId: auth.user.id, action: 'job.opened', subjectType: 'Job', subjectId: inserted.id, at: clock.now() });
    // "I need a flashing kit": the rental request commits with the job; the shop picks the kit and books it.
    const kit = input.kitRequest;
    if (kit) {
      await insertRentalRequest(trx, { shopId: auth.shop.id, currency: auth.shop.currency, job: inserted, startDate: kit.startDate, dueDate: kit.dueDate, notes: kit.notes, shippingDays: rentalSettings(settings).shippingDays, actorUserId: auth.user.id, now: clock.now() });
    }
    const job = (await findJob(trx, auth.shop.id, inserted.id))!;
    const link = jobLink(deps.env.APP_ORIGIN, job.id);
    const ref = `Job ${job.number} (${job.vehicle_description})`;
    await notify(trx, {
      shopId: auth.shop.id,
      jobId: job.id,
      kind: 'job_received',
      recipients: await customerSideOf(trx, job),
      title: `We received your job — ${ref}`,
      body: `${auth.shop.name ?? 'The shop'} has your job for the ${job.package_name} package. Next: read the calibration off the vehicle and upload it as the stock read.`,
      emailLines: ['', ...FLASH_CAUTIONS],
      link,
      at: clock.now(),
    });
    await notify(
      trx,
      { shopId: auth.shop.id, jobId: job.id, kind: 'job_received', recipients: await shopSideOf(trx, job), title: `New job — ${ref}`, body: `${job.customer_name} opened a job for the ${job.package_name} package.${kit ? ` A flashing kit is asked for from ${kit.startDate} to ${kit.dueDate}: pick one and book it.` : ''}`, link, at: clock.now() },
      auth.user.id,
    );
    return { job, debit };
  });
  await afterDealerDebit(deps, auth.shop.id, debit);
  await drainMailOutbox(deps);
  return job;
}
