import type Stripe from 'stripe';
import { findRental, findRentalByCheckoutSession, findRentalByHoldIntent, newId, updateRental, type Db, type RentalRow } from '@revloop/db';
import type { RentalCheckout } from '@revloop/contract';
import { DomainError } from '@revloop/domain';
import { formatMoney } from '@revloop/domain/billing';
import { MERCHANT_HOLD_MS, lateFeeMinor, settleDeposit } from '@revloop/domain/rentals';
import type { AppDeps } from '../../context';
import { authorizeRow } from '../../http/auth-context';
import { writeWithAudit } from '../audit/audit.service';
import { fromUnix, idOf, stripeFor } from '../billing/stripe-client';
import { jobLink } from '../jobs/job.service';
import { addEntry, auditRental, loadRental, rentalAuditEvents, rentalSubject, type ShopAuth } from './rental-records';

// The deposit design is docs/decisions/012-kit-deposit-holds.md: the card is saved at booking (setup-mode Checkout),
// the hold is placed off-session when the kit ships, re-placed by the sweep before it lapses, and settled on close.

type MoneyDeps = Pick<AppDeps, 'db' | 'clock' | 'env' | 'logger'>;

const money = (row: Pick<RentalRow, 'currency'>, minor: number) => formatMoney(minor, row.currency);

/** Who may start a rental payment: the same people who may pay for the job (Payment abilities). */
async function payableRental(deps: MoneyDeps, auth: ShopAuth, id: string) {
  const row = await loadRental(deps.db, auth, id);
  authorizeRow(auth, 'create', 'Payment', rentalSubject(row), 'Rental not found.');
  if (row.state !== 'booked') throw new DomainError('invalid_transition', 'Rental payments are made once the kit is booked and before it ships.');
  return row;
}

/** POST /api/rentals/:id/fee/checkout: the rental fee through Checkout, one payment per booking. */
export async function startFeeCheckout(deps: MoneyDeps, auth: ShopAuth, id: string): Promise<RentalCheckout> {
  const row = await payableRental(deps, auth, id);
  if (row.fee_paid_at) throw new DomainError('conflict', 'The rental fee is already paid.');
  if (row.fee_minor === 0) throw new DomainError('conflict', 'This rental has no fee.');
  const stripe = stripeFor(deps.env);
  if (row.fee_checkout_session_id) {
    const open = await stripe.checkout.sessions.retrieve(row.fee_checkout_session_id).catch(() => null);
    if (open?.status === 'open' && open.url) return { url: open.url, sessionId: open.id };
  }
  const link = jobLink(deps.env.APP_ORIGIN, row.job_id);
  const metadata = { rentalId: row.id, shopId: row.shop_id, purpose: 'rental_fee' };
  const session = await stripe.checkout.sessions.create(
    {
      mode: 'payment',
      line_items: [{ price_data: { currency: row.currency.toLowerCase(), unit_amount: row.fee_minor, product_data: { name: `Kit rental ${row.kit_name ?? ''} ${row.start_date} to ${row.due_date}`.replace('  ', ' ') } }, quantity: 1 }],
      customer_email: auth.user.email,
      client_reference_id: row.id,
      metadata,
      payment_intent_data: { metadata },
      success_url: `${link}?rentalFee=done`,
      cancel_url: `${link}?rentalFee=cancelled`,
    },
    { idempotencyKey: `rental-fee-${row.id}-${newId()}` },
  );
  await updateRental(deps.db, row.shop_id, row.id, { fee_checkout_session_id: session.id, updated_at: deps.clock.now().toISOString() });
  return { url: session.url!, sessionId: session.id };
}

/** POST /api/rentals/:id/deposit/checkout: saves the card the deposit will be held on (Checkout in setup mode). */
export async function startDepositCheckout(deps: MoneyDeps, auth: ShopAuth, id: string): Promise<RentalCheckout> {
  const row = await payableRental(deps, auth, id);
  if (row.deposit_minor === 0) throw new DomainError('conflict', 'This kit takes no deposit.');
  if (row.payment_method_id) throw new DomainError('conflict', 'The card for the deposit is already saved.');
  const stripe = stripeFor(deps.env);
  let customerId = row.stripe_customer_id;
  if (!customerId) {
    const customer = await stripe.customers.create({ email: auth.user.email, name: auth.user.name, metadata: { shopId: row.shop_id, rentalId: row.id } }, { idempotencyKey: `rental-customer-${row.id}` });
    customerId = customer.id;
  }
  const link = jobLink(deps.env.APP_ORIGIN, row.job_id);
  const metadata = { rentalId: row.id, shopId: row.shop_id, purpose: 'rental_deposit' };
  const session = await stripe.checkout.sessions.create(
    {
      mode: 'setup',
      customer: customerId,
      currency: row.currency.toLowerCase(),
      client_reference_id: row.id,
      metadata,
      setup_intent_data: { metadata, description: `Deposit of ${money(row, row.deposit_minor)} held while the kit is out` },
      success_url: `${link}?rentalDeposit=done`,
      cancel_url: `${link}?rentalDeposit=cancelled`,
    },
    { idempotencyKey: `rental-setup-${row.id}-${newId()}` },
  );
  await updateRental(deps.db, row.shop_id, row.id, { stripe_customer_id: customerId, setup_checkout_session_id: session.id, updated_at: deps.clock.now().toISOString() });
  return { url: session.url!, sessionId: session.id };
}

/** When the provider will let the hold go: the charge's capture_before, else the documented merchant window. */
async function holdExpiry(stripe: Stripe, intent: Stripe.PaymentIntent, now: Date): Promise<string> {
  const chargeId = idOf(intent.latest_charge as string | { id: string } | null);
  const charge = chargeId ? await stripe.charges.retrieve(chargeId).catch(() => null) : null;
  return fromUnix(charge?.payment_method_details?.card?.capture_before) ?? new Date(now.getTime() + MERCHANT_HOLD_MS).toISOString();
}

/** Places (or re-places) the deposit hold off-session on the saved card; the old hold is released after. */
export async function placeHold(deps: MoneyDeps, row: RentalRow): Promise<void> {
  if (!row.payment_method_id || !row.stripe_customer_id) throw new DomainError('conflict', 'No saved card to hold the deposit on.');
  const stripe = stripeFor(deps.env);
  const now = deps.clock.now();
  const intent = await stripe.paymentIntents.create(
    {
      amount: row.deposit_minor,
      currency: row.currency.toLowerCase(),
      customer: row.stripe_customer_id,
      payment_method: row.payment_method_id,
      capture_method: 'manual',
      confirm: true,
      off_session: true,
      description: `Kit deposit held (rental ${row.id})`,
      metadata: { rentalId: row.id, shopId: row.shop_id, purpose: 'rental_hold' },
    },
    { idempotencyKey: `rental-hold-${row.id}-${newId()}` },
  );
  const expiresAt = await holdExpiry(stripe, intent, now);
  const previous = row.deposit_status === 'held' ? row.hold_intent_id : null;
  await deps.db.transaction().execute(async (trx) => {
    await updateRental(trx, row.shop_id, row.id, { deposit_status: 'held', hold_intent_id: intent.id, hold_minor: row.deposit_minor, hold_expires_at: expiresAt, updated_at: now.toISOString() });
    await addEntry(trx, row, 'hold_placed', row.deposit_minor, `Deposit of ${money(row, row.deposit_minor)} held on your card until ${expiresAt.slice(0, 10)}${previous ? ' (renewed before the last hold lapsed)' : ''}`, now, `${intent.id}:placed`);
  });
  if (previous) {
    await stripe.paymentIntents.cancel(previous, {}, { idempotencyKey: `rental-release-${previous}` }).catch((err: unknown) => deps.logger.warn({ err, previous }, 'old hold already gone'));
    await addEntry(deps.db, row, 'hold_released', row.hold_minor, 'Previous hold released (replaced by the renewed one)', now, `${previous}:released`);
  }
}

/**
 * On close: late days at the kit's daily fee plus the owner's capture are taken from the hold, the rest of the hold
 * is released; what the hold cannot cover (a lapsed hold) is charged off-session to the saved card.
 */
export async function settleHold(deps: MoneyDeps, auth: ShopAuth, row: RentalRow, input: { lateDays: number; capture: { amountMinor: number; reason: string } | null }): Promise<void> {
  const damage = input.capture?.amountMinor ?? 0;
  if (damage > row.deposit_minor) throw new DomainError('validation', `capture.amountMinor: At most the deposit, ${money(row, row.deposit_minor)}.`);
  const late = lateFeeMinor(input.lateDays, row.late_fee_per_day_minor);
  const held = row.deposit_status === 'held' && row.hold_intent_id ? row.hold_minor : 0;
  const plan = settleDeposit(held, late, damage);
  if (plan.chargeMinor > 0 && !row.payment_method_id) throw new DomainError('conflict', 'There is no saved card to charge what the customer owes.');
  const stripe = stripeFor(deps.env);
  const now = deps.clock.now();
  if (held > 0 && plan.captureMinor > 0) {
    await stripe.paymentIntents.capture(row.hold_intent_id!, { amount_to_capture: plan.captureMinor }, { idempotencyKey: `rental-capture-${row.hold_intent_id}` });
  } else if (held > 0) {
    await stripe.paymentIntents.cancel(row.hold_intent_id!, {}, { idempotencyKey: `rental-release-${row.hold_intent_id}` });
  }
  let chargeId: string | null = null;
  if (plan.chargeMinor > 0) {
    const charge = await stripe.paymentIntents.create(
      { amount: plan.chargeMinor, currency: row.currency.toLowerCase(), customer: row.stripe_customer_id!, payment_method: row.payment_method_id!, confirm: true, off_session: true, metadata: { rentalId: row.id, shopId: row.shop_id, purpose: 'rental_charge' } },
      { idempotencyKey: `rental-charge-${row.id}` },
    );
    chargeId = charge.id;
  }
  const from = (minor: number) => (minor <= plan.captureMinor ? 'from the deposit hold' : chargeId ? 'partly charged to your saved card' : '');
  await writeWithAudit(
    deps.db,
    async (trx) => {
      if (late > 0) await addEntry(trx, row, 'late_fee', late, `${input.lateDays} late day${input.lateDays === 1 ? '' : 's'} × ${money(row, row.late_fee_per_day_minor)} ${from(late)}`.trim(), now, `${row.id}:late_fee`);
      if (damage > 0) await addEntry(trx, row, 'capture', damage, `${input.capture!.reason} (${from(late + damage)})`, now, `${row.id}:capture`);
      if (held > plan.captureMinor) await addEntry(trx, row, 'hold_released', held - plan.captureMinor, `${money(row, held - plan.captureMinor)} of the deposit hold released`, now, `${row.hold_intent_id}:released`);
      await updateRental(trx, row.shop_id, row.id, {
        deposit_status: plan.captureMinor > 0 || plan.chargeMinor > 0 ? 'captured' : held > 0 ? 'released' : row.deposit_status,
        hold_minor: 0,
        hold_expires_at: null,
        updated_at: now.toISOString(),
      });
    },
    () => rentalAuditEvents(row, auth.user.id, 'rental.settled', `Deposit settled: ${money(row, plan.captureMinor + plan.chargeMinor)} taken, ${money(row, Math.max(0, held - plan.captureMinor))} released`, now),
  );
}

/** Sweep step: re-places holds that lapse within a day (or already lapsed) while the kit is still out. */
export async function renewHolds(deps: MoneyDeps, rows: RentalRow[]): Promise<number> {
  const now = deps.clock.now();
  let renewed = 0;
  for (const row of rows) {
    if (row.deposit_minor === 0 || !row.payment_method_id) continue;
    const lapsing = row.deposit_status === 'held' && row.hold_expires_at !== null && new Date(row.hold_expires_at).getTime() - now.getTime() <= 24 * 3_600_000;
    if (!lapsing && row.deposit_status !== 'lapsed') continue;
    try {
      await placeHold(deps, row);
      renewed += 1;
    } catch (err) {
      deps.logger.warn({ err, rentalId: row.id }, 'deposit hold could not be re-placed');
    }
  }
  return renewed;
}

type Claim = (db: Db) => Promise<boolean>;

/**
 * The rental side of the payment webhook; true when the event was about a rental (and is now applied, once).
 * Called first by the billing webhook handler.
 */
export async function handleRentalStripeEvent(deps: Pick<AppDeps, 'db' | 'clock' | 'env'>, event: Stripe.Event, claimFor: (shopId: string | null) => Claim): Promise<boolean> {
  const now = deps.clock.now();
  if (event.type === 'checkout.session.completed') {
    const session = event.data.object;
    if (!session.metadata?.rentalId) return false;
    const row = await findRentalByCheckoutSession(deps.db, session.id);
    if (!row) return false;
    const setupIntentId = session.mode === 'setup' ? idOf(session.setup_intent as string | { id: string } | null) : null;
    const setupIntent = setupIntentId ? await stripeFor(deps.env).setupIntents.retrieve(setupIntentId) : null;
    await deps.db.transaction().execute(async (trx) => {
      if (!(await claimFor(row.shop_id)(trx))) return;
      if (session.mode === 'payment' && session.payment_status === 'paid' && !row.fee_paid_at) {
        await updateRental(trx, row.shop_id, row.id, { fee_paid_at: now.toISOString(), updated_at: now.toISOString() });
        await addEntry(trx, row, 'fee', session.amount_total ?? row.fee_minor, `Rental fee paid, ${money(row, session.amount_total ?? row.fee_minor)}`, now, `${session.id}:fee`);
        await auditRental(trx, row, null, 'rental.fee_paid', 'Rental fee paid', now);
      }
      if (setupIntent) await saveCard(trx, row, setupIntent.id, idOf(setupIntent.payment_method as string | { id: string } | null), now);
    });
    return true;
  }
  if (event.type === 'setup_intent.succeeded') {
    const intent = event.data.object;
    const rentalId = intent.metadata?.rentalId;
    if (!rentalId) return false;
    const shopId = intent.metadata?.shopId ?? '';
    const row = await findRental(deps.db, shopId, rentalId);
    if (!row) return false;
    await deps.db.transaction().execute(async (trx) => {
      if (await claimFor(row.shop_id)(trx)) await saveCard(trx, row, intent.id, idOf(intent.payment_method as string | { id: string } | null), now);
    });
    return true;
  }
  if (event.type === 'payment_intent.canceled') {
    const intent = event.data.object;
    const row = await findRentalByHoldIntent(deps.db, intent.id);
    if (!row) return intent.metadata?.purpose === 'rental_hold';
    await deps.db.transaction().execute(async (trx) => {
      if (!(await claimFor(row.shop_id)(trx))) return;
      // Only a lapse matters here: releases we asked for are recorded when we ask.
      if (intent.cancellation_reason !== 'automatic' || row.deposit_status !== 'held') return;
      await updateRental(trx, row.shop_id, row.id, { deposit_status: 'lapsed', hold_minor: 0, updated_at: now.toISOString() });
      await addEntry(trx, row, 'hold_lapsed', row.hold_minor, 'The card issuer let the deposit hold lapse; it will be placed again', now, `${intent.id}:lapsed`);
      await auditRental(trx, row, null, 'rental.hold_lapsed', 'Deposit hold lapsed at the card issuer', now);
    });
    return true;
  }
  return false;
}

/** Records the saved card once, whichever of the two events about it arrives first. */
async function saveCard(db: Db, row: RentalRow, setupIntentId: string, paymentMethodId: string | null, now: Date): Promise<void> {
  const current = await findRental(db, row.shop_id, row.id);
  if (!paymentMethodId || !current || current.payment_method_id) return;
  await updateRental(db, row.shop_id, row.id, { payment_method_id: paymentMethodId, deposit_status: 'card_saved', updated_at: now.toISOString() });
  await addEntry(db, row, 'card_saved', 0, 'Card saved for the deposit hold (nothing charged)', now, `${setupIntentId}:saved`);
  await auditRental(db, row, null, 'rental.card_saved', 'Card saved for the deposit hold', now);
}
