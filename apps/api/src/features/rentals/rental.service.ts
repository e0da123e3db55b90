import {
  bookRequestedRentalIfFree,
  findKit,
  findRental,
  insertRentalIfFree,
  listRentalEntries,
  listRentals,
  newId,
  updateKit,
  updateRental,
  type Db,
  type KitRow,
  type RentalListRow,
  type RentalRow,
} from '@revloop/db';
import type { Rental, RentalCreate, RentalSummary, RentalTransition } from '@revloop/contract';
import { DomainError } from '@revloop/domain';
import { asSubject } from '@revloop/domain/auth';
import { formatMoney } from '@revloop/domain/billing';
import {
  assertRentalMove,
  availableRentalMoves,
  BLOCKING_STATES,
  blockedRange,
  kitStatusAfterMove,
  lateDays,
  localDay,
  rentalFeeMinor,
  RENTAL_STATE_LABELS,
  type RentalFacts,
  type RentalState,
} from '@revloop/domain/rentals';
import type { AppDeps } from '../../context';
import { authorizeRow } from '../../http/auth-context';
import { writeWithAudit } from '../audit/audit.service';
import { loadJob } from '../jobs/job.service';
import { placeHold, settleHold } from './rental-money';
import { auditRental, loadRental, rentalAuditEvents, rentalSubject, shopRentalSettings, type ShopAuth } from './rental-records';
import { notifyRental } from './rental-notices';
import { insertRentalRequest } from './rental-request';

export const factsOf = (row: RentalRow): RentalFacts => ({
  state: row.state,
  kitId: row.kit_id,
  customerUserId: row.customer_user_id,
  dealerId: row.dealer_id,
  termsAccepted: row.terms_accepted_at !== null,
  // A kit rented at no fee has nothing to pay before it ships.
  feePaid: row.fee_paid_at !== null || row.fee_minor === 0,
  depositDue: row.deposit_minor > 0,
  cardSaved: row.payment_method_id !== null,
});

/** Late days so far: up to the received day once back, else up to today in the shop's zone while out. */
export function lateDaysOf(row: Pick<RentalRow, 'state' | 'due_date' | 'received_date'>, today: string): number {
  if (row.received_date) return lateDays(row.due_date, row.received_date);
  return row.state === 'shipped' || row.state === 'with_customer' ? lateDays(row.due_date, today) : 0;
}

export function summaryOf(row: RentalListRow, today: string): RentalSummary {
  return {
    id: row.id,
    jobId: row.job_id,
    kitId: row.kit_id,
    kitName: row.kit_name,
    customerName: row.customer_name,
    state: row.state,
    startDate: row.start_date,
    dueDate: row.due_date,
    lateDays: lateDaysOf(row, today),
  };
}

function nextStepOf(row: RentalListRow, shippingDays: number, audience: 'shop' | 'customer'): string {
  const shipOn = blockedRange(row.start_date, row.due_date, shippingDays).from;
  const tracking = row.tracking_number ? `, tracking ${row.carrier ?? ''} ${row.tracking_number}`.replace('  ', ' ') : '';
  switch (row.state) {
    case 'requested':
      return audience === 'shop' ? 'Pick a kit and dates to book this request.' : 'The shop will pick a kit and confirm the dates.';
    case 'booked': {
      const missing = [
        row.terms_accepted_at ? null : 'agree to the rental terms',
        row.fee_paid_at ? null : 'pay the rental fee',
        row.deposit_minor > 0 && !row.payment_method_id ? 'save the card for the deposit hold' : null,
      ].filter(Boolean);
      if (missing.length === 0) return `Kit ships on ${shipOn}.`;
      return audience === 'shop' ? `Kit ships on ${shipOn}; waiting for the customer to ${missing.join(', ')}.` : `Kit ships on ${shipOn}: please ${missing.join(', ')}.`;
    }
    case 'shipped':
    case 'with_customer':
      return audience === 'shop' ? `Due back ${row.due_date}${tracking}.` : `Return the kit by ${row.due_date}${tracking}.`;
    case 'returned':
      return audience === 'shop' ? 'Check the kit, then settle the deposit and close.' : 'The shop is checking the returned kit.';
    case 'closed':
      return 'Rental closed.';
    case 'cancelled':
      return 'Rental cancelled.';
  }
}

/** The API object of a rental for this viewer. */
export async function presentRental(deps: Pick<AppDeps, 'db' | 'clock'>, auth: ShopAuth, row: RentalListRow): Promise<Rental> {
  const { shippingDays, timeZone } = shopRentalSettings(auth.shop.settings);
  const today = localDay(deps.clock.now(), timeZone);
  const entries = await listRentalEntries(deps.db, auth.shop.id, row.id);
  const staff = auth.actor.role === 'owner' || auth.actor.role === 'tuner';
  return {
    ...summaryOf(row, today),
    customerUserId: row.customer_user_id,
    notes: row.notes,
    blocked: { from: row.blocked_from, to: row.blocked_to },
    carrier: row.carrier,
    trackingNumber: row.tracking_number,
    shippedAt: row.shipped_at,
    deliveredAt: row.delivered_at,
    receivedDate: row.received_date,
    returnedContents: row.returned_contents ? (JSON.parse(row.returned_contents) as { item: string; present: boolean }[]) : null,
    condition: row.condition,
    conditionNotes: row.condition_notes,
    cancelReason: row.cancel_reason,
    termsAcceptedAt: row.terms_accepted_at,
    currency: row.currency,
    feeMinor: row.fee_minor,
    feePaid: row.fee_paid_at !== null,
    depositMinor: row.deposit_minor,
    lateFeePerDayMinor: row.late_fee_per_day_minor,
    deposit: { status: row.deposit_status, heldMinor: row.hold_minor, holdExpiresAt: row.hold_expires_at },
    entries: entries.map((e) => ({ id: e.id, kind: e.kind, amountMinor: e.amount_minor, description: e.description, at: e.at })),
    availableTransitions: availableRentalMoves(factsOf(row), auth.actor),
    nextStep: nextStepOf(row, shippingDays, staff ? 'shop' : 'customer'),
    createdAt: row.created_at,
  };
}

function clashError(clashes: RentalListRow[]): DomainError {
  return new DomainError('rental_clash', 'The kit is already booked on some of those days (shipping days included). Pick other dates or another kit.', {
    clashes: clashes.map((c) => ({ from: c.blocked_from, to: c.blocked_to })),
  });
}

async function bookableKit(db: Db, shopId: string, kitId: string): Promise<KitRow> {
  const kit = await findKit(db, shopId, kitId);
  if (!kit) throw new DomainError('not_found', 'Kit not found.');
  if (kit.status === 'retired') throw new DomainError('conflict', 'This kit is retired.');
  return kit;
}

async function otherBookings(db: Db, shopId: string, kitId: string, exceptId: string): Promise<number> {
  const rows = await listRentals(db, shopId, { kind: 'shop' }, { kitId, states: BLOCKING_STATES });
  return rows.filter((r) => r.id !== exceptId).length;
}

async function setKitStatusAfter(db: Db, row: RentalRow, to: RentalState, at: Date) {
  if (!row.kit_id) return;
  const kit = await findKit(db, row.shop_id, row.kit_id);
  if (!kit) return;
  const next = kitStatusAfterMove(kit.status, to, await otherBookings(db, row.shop_id, kit.id, row.id));
  if (next !== kit.status) await updateKit(db, row.shop_id, kit.id, { status: next, updated_at: at.toISOString() });
}

/** POST /api/rentals: staff book a kit at once; customers and dealers ask, and the shop picks the kit. */
export async function createRental(deps: AppDeps, auth: ShopAuth, input: RentalCreate): Promise<RentalListRow> {
  const job = await loadJob(deps.db, auth, input.jobId);
  const subject = { shopId: job.shop_id, customerUserId: job.customer_user_id, dealerId: job.dealer_id };
  authorizeRow(auth, 'create', 'Rental', subject, 'Job not found.');
  if (job.state === 'cancelled' || job.state === 'dialed_in') throw new DomainError('conflict', 'This job is finished, so it needs no kit.');
  const staff = auth.ability.can('book', asSubject('Rental', subject));
  if (input.kitId && !staff) throw new DomainError('forbidden', 'The shop picks the kit: ask without one.');
  const { shippingDays } = shopRentalSettings(auth.shop.settings);
  const now = deps.clock.now();
  const at = now.toISOString();
  const blocked = blockedRange(input.startDate, input.dueDate, shippingDays);
  const kit = input.kitId ? await bookableKit(deps.db, auth.shop.id, input.kitId) : null;
  const row = {
    id: newId(),
    shop_id: auth.shop.id,
    job_id: job.id,
    kit_id: kit?.id ?? null,
    customer_user_id: job.customer_user_id,
    dealer_id: job.dealer_id,
    state: (kit ? 'booked' : 'requested') as RentalState,
    start_date: input.startDate,
    due_date: input.dueDate,
    blocked_from: blocked.from,
    blocked_to: blocked.to,
    notes: input.notes,
    currency: auth.shop.currency,
    fee_minor: kit ? rentalFeeMinor(input.startDate, input.dueDate, kit.weekly_price_minor) : 0,
    deposit_minor: kit?.deposit_minor ?? 0,
    late_fee_per_day_minor: kit?.late_fee_per_day_minor ?? 0,
    created_at: at,
    updated_at: at,
  };
  const text = kit ? `Kit ${kit.name} booked ${input.startDate} to ${input.dueDate}` : `Kit asked for ${input.startDate} to ${input.dueDate}`;
  if (kit) {
    const result = await insertRentalIfFree(deps.db, { ...row, kit_id: kit.id }, async (trx, rental) => {
      await auditRental(trx, rental, auth.user.id, 'rental.booked', text, now);
      await setKitStatusAfter(trx, rental, 'booked', now);
    });
    if (!result.ok) throw clashError(result.clashes);
  } else {
    row.id = await insertRentalRequest(deps.db, { shopId: auth.shop.id, currency: auth.shop.currency, job, startDate: input.startDate, dueDate: input.dueDate, notes: input.notes, shippingDays, actorUserId: auth.user.id, now });
  }
  await notifyRental(deps, row.id, row.shop_id, kit ? 'booked' : 'requested');
  return (await findRental(deps.db, auth.shop.id, row.id))!;
}

const MOVE_TEXT: Record<RentalState, string> = {
  requested: 'Kit asked for',
  booked: 'Kit booked',
  shipped: 'Kit shipped',
  with_customer: 'Kit arrived with the customer',
  returned: 'Kit received back',
  closed: 'Rental settled and closed',
  cancelled: 'Rental cancelled',
};

/** POST /api/rentals/:id/transitions. */
export async function moveRental(deps: AppDeps, auth: ShopAuth, id: string, input: RentalTransition): Promise<RentalListRow> {
  const row = await loadRental(deps.db, auth, id);
  authorizeRow(auth, 'transition', 'Rental', rentalSubject(row), 'Rental not found.');
  assertRentalMove(factsOf(row), auth.actor, input.to);
  const now = deps.clock.now();
  const at = now.toISOString();
  const { shippingDays, timeZone } = shopRentalSettings(auth.shop.settings);
  const moved = () => new DomainError('conflict', `The rental changed under you; it is no longer ${RENTAL_STATE_LABELS[row.state].toLowerCase()}.`);

  if (input.to === 'booked') {
    const kit = await bookableKit(deps.db, auth.shop.id, input.kitId);
    const startDate = input.startDate ?? row.start_date;
    const dueDate = input.dueDate ?? row.due_date;
    if (startDate > dueDate) throw new DomainError('validation', 'dueDate: The due date is before the start date.');
    const blocked = blockedRange(startDate, dueDate, shippingDays);
    const patch = {
      state: 'booked' as const,
      kit_id: kit.id,
      start_date: startDate,
      due_date: dueDate,
      blocked_from: blocked.from,
      blocked_to: blocked.to,
      fee_minor: rentalFeeMinor(startDate, dueDate, kit.weekly_price_minor),
      deposit_minor: kit.deposit_minor,
      late_fee_per_day_minor: kit.late_fee_per_day_minor,
      updated_at: at,
    };
    const result = await bookRequestedRentalIfFree(deps.db, auth.shop.id, row.id, patch, async (trx, rental) => {
      await auditRental(trx, rental, auth.user.id, 'rental.booked', `Kit ${kit.name} booked ${startDate} to ${dueDate}`, now);
      await setKitStatusAfter(trx, rental, 'booked', now);
    });
    if (!result) throw moved();
    if (!result.ok) throw clashError(result.clashes);
  } else if (input.to === 'shipped') {
    const patch = { state: 'shipped' as const, carrier: input.carrier, tracking_number: input.trackingNumber, shipped_at: at, updated_at: at };
    const updated = await writeWithAudit(
      deps.db,
      async (trx) => {
        const shipped = await updateRental(trx, auth.shop.id, row.id, patch, row.state);
        if (!shipped) throw moved();
        await setKitStatusAfter(trx, shipped, 'shipped', now);
        return shipped;
      },
      (shipped) => rentalAuditEvents(shipped, auth.user.id, 'rental.shipped', `Kit shipped by ${input.carrier}, tracking ${input.trackingNumber}`, now),
    );
    // The hold is a call to the payment provider, so it follows the commit.
    if (updated.deposit_minor > 0) await placeHold(deps, updated);
  } else if (input.to === 'returned') {
    const patch = {
      state: 'returned' as const,
      received_date: input.receivedDate,
      returned_contents: JSON.stringify(input.contents),
      condition: input.condition,
      condition_notes: input.conditionNotes,
      updated_at: at,
    };
    const missing = input.contents.filter((c) => !c.present).map((c) => c.item);
    const text = `Kit received back on ${input.receivedDate}, condition ${input.condition.replace('_', ' ')}${missing.length ? `; missing: ${missing.join(', ')}` : ''}`;
    await writeWithAudit(
      deps.db,
      async (trx) => {
        const updated = await updateRental(trx, auth.shop.id, row.id, patch, row.state);
        if (!updated) throw moved();
        await setKitStatusAfter(trx, updated, 'returned', now);
        return updated;
      },
      (updated) => rentalAuditEvents(updated, auth.user.id, 'rental.returned', text, now),
    );
  } else if (input.to === 'closed') {
    const late = input.waiveLateFee ? 0 : lateDaysOf(row, localDay(now, timeZone));
    await settleHold(deps, auth, row, { lateDays: late, capture: input.capture ?? null });
    const charged = input.capture ? `; ${formatMoney(input.capture.amountMinor, row.currency)} taken: ${input.capture.reason}` : '';
    await writeWithAudit(
      deps.db,
      async (trx) => {
        const updated = await updateRental(trx, auth.shop.id, row.id, { state: 'closed', closed_at: at, updated_at: at }, 'returned');
        if (!updated) throw moved();
        return updated;
      },
      (updated) => rentalAuditEvents(updated, auth.user.id, 'rental.closed', `Rental closed${late ? ` with ${late} late day${late === 1 ? '' : 's'}` : ''}${charged}`, now),
    );
  } else {
    const patch = input.to === 'cancelled' ? { state: 'cancelled' as const, cancel_reason: input.reason, updated_at: at } : { state: input.to, delivered_at: at, updated_at: at };
    await writeWithAudit(
      deps.db,
      async (trx) => {
        const updated = await updateRental(trx, auth.shop.id, row.id, patch, row.state);
        if (!updated) throw moved();
        await setKitStatusAfter(trx, updated, input.to, now);
        return updated;
      },
      (updated) => rentalAuditEvents(updated, auth.user.id, `rental.${input.to}`, MOVE_TEXT[input.to], now),
    );
  }
  await notifyRental(deps, row.id, row.shop_id, input.to);
  return (await findRental(deps.db, auth.shop.id, row.id))!;
}

/** POST /api/rentals/:id/terms: the job's customer (or its dealer) agrees to the late, damage and loss terms. */
export async function acceptTerms(deps: AppDeps, auth: ShopAuth, id: string): Promise<RentalListRow> {
  const row = await loadRental(deps.db, auth, id);
  authorizeRow(auth, 'agree', 'Rental', rentalSubject(row), 'Rental not found.');
  if (row.state !== 'requested' && row.state !== 'booked') throw new DomainError('invalid_transition', 'The terms are agreed before the kit ships.');
  if (row.terms_accepted_at) return row;
  const now = deps.clock.now();
  await writeWithAudit(
    deps.db,
    (trx) => updateRental(trx, auth.shop.id, row.id, { terms_accepted_at: now.toISOString(), updated_at: now.toISOString() }),
    () => rentalAuditEvents(row, auth.user.id, 'rental.terms_accepted', 'Rental terms agreed', now),
  );
  return (await findRental(deps.db, auth.shop.id, row.id))!;
}
