import type Stripe from 'stripe';
import {
  countJobsOpenedSince,
  countSeatsInUse,
  findShopById,
  findShopSubscription,
  insertShopSubscription,
  insertSubscriptionChange,
  listMembers,
  listShopSubscriptions,
  listShopsWithoutSubscription,
  listSubscriptionInvoices,
  newId,
  updateShopSubscription,
  upsertSubscriptionInvoice,
  findUserById,
  type Db,
  type ShopSubscriptionRow,
} from '@revloop/db';
import type { Subscription } from '@revloop/contract';
import { DomainError } from '@revloop/domain';
import { parseShopSettings } from '@revloop/domain/shops';
import {
  PLANS,
  PLATFORM_CURRENCY,
  READ_ONLY_REASON_TEXT,
  SUBSCRIPTION_STATUS_LABELS,
  TRIAL_DAYS,
  TRIAL_PLAN,
  assertPlanChoice,
  graceEndsAt,
  monthlyAmountMinor,
  mrrMinorOf,
  planById,
  readOnlyReasonOf,
  toSubscriptionStatus,
  type CheckoutInput,
  type PlanId,
} from '@revloop/domain/billing';
import type { AppDeps } from '../../context';
import { recordAudit } from '../audit/audit.service';
import { paymentFailedMail, readOnlyMail, restoredMail } from './billing.mails';
import { fromUnix, idOf, stripeFor } from './stripe-client';

const DAY_MS = 86_400_000;
const LIVE = new Set(['trialing', 'active', 'past_due', 'unpaid']);
const billingLink = (deps: Pick<AppDeps, 'env'>) => `${deps.env.APP_ORIGIN}/billing`;

/** The shop's subscription row, creating the trial a new shop starts with (sign-up and admin-created shops alike). */
export async function ensureSubscription(db: Db, shopId: string, now: Date): Promise<ShopSubscriptionRow> {
  const existing = await findShopSubscription(db, shopId);
  if (existing) return existing;
  const shop = await findShopById(db, shopId);
  if (!shop) throw new DomainError('not_found', 'Shop not found.');
  const plan = planById(TRIAL_PLAN);
  const seats = Math.min(plan.maxSeats, Math.max(plan.minSeats, await countSeatsInUse(db, shopId)));
  const at = now.toISOString();
  const row = await insertShopSubscription(db, {
    shop_id: shopId,
    plan_id: plan.id,
    seats,
    status: 'trialing',
    trial_ends_at: new Date(Date.parse(shop.created_at) + TRIAL_DAYS * DAY_MS).toISOString(),
    current_period_end: null,
    past_due_since: null,
    read_only_reason: null,
    stripe_customer_id: null,
    stripe_subscription_id: null,
    provider_clock: null,
    created_at: at,
    updated_at: at,
  });
  await insertSubscriptionChange(db, { id: newId(), shop_id: shopId, plan_id: row.plan_id, seats: row.seats, status: row.status, mrr_minor: 0, at: shop.created_at });
  return row;
}

async function ownerEmails(db: Db, shopId: string): Promise<string[]> {
  const owners = (await listMembers(db, shopId, { role: 'owner' })).filter((m) => m.status === 'active');
  const emails: string[] = [];
  for (const owner of owners) {
    const user = await findUserById(db, owner.user_id);
    if (user) emails.push(user.email);
  }
  return emails;
}

type Standing = Pick<ShopSubscriptionRow, 'plan_id' | 'seats' | 'status' | 'trial_ends_at' | 'current_period_end' | 'cancel_at_period_end' | 'past_due_since' | 'stripe_subscription_id' | 'provider_clock'>;

/**
 * Writes a new standing for the shop and what follows from it: the read-only reason, a history row when the MRR
 * inputs change, an audit row and the owner's mails on the transitions that matter. Runs once per change: callers
 * hold the transaction that claimed the webhook event.
 */
async function applyStanding(deps: AppDeps, db: Db, before: ShopSubscriptionRow, next: Standing, now: Date): Promise<() => Promise<void>> {
  const clock = [now.toISOString(), next.provider_clock, before.provider_clock].filter((t): t is string => Boolean(t)).sort().at(-1)!;
  const reason = readOnlyReasonOf({ status: next.status, trialEndsAt: next.stripe_subscription_id ? null : next.trial_ends_at, pastDueSince: next.past_due_since }, new Date(clock));
  const at = now.toISOString();
  await updateShopSubscription(db, before.shop_id, { ...next, provider_clock: clock, read_only_reason: reason, updated_at: at });
  const mrr = mrrMinorOf({ status: next.status, planId: next.plan_id, seats: next.seats });
  const mrrBefore = mrrMinorOf({ status: before.status, planId: before.plan_id, seats: before.seats });
  if (mrr !== mrrBefore || next.status !== before.status || next.plan_id !== before.plan_id || next.seats !== before.seats) {
    await insertSubscriptionChange(db, { id: newId(), shop_id: before.shop_id, plan_id: next.plan_id, seats: next.seats, status: next.status, mrr_minor: mrr, at });
    await recordAudit(db, {
      shopId: before.shop_id,
      actorUserId: null,
      action: 'subscription.changed',
      subjectType: 'Subscription',
      subjectId: before.shop_id,
      details: { from: { plan: before.plan_id, seats: before.seats, status: before.status }, to: { plan: next.plan_id, seats: next.seats, status: next.status }, readOnlyReason: reason },
      at: now,
    });
  }
  const mails: Array<(to: string, shopName: string, timeZone: string) => ReturnType<typeof restoredMail>> = [];
  if (next.status === 'past_due' && before.status !== 'past_due' && next.past_due_since) {
    const ends = graceEndsAt(next.past_due_since);
    mails.push((to, shopName, timeZone) => paymentFailedMail(to, { shopName, graceEndsAt: ends, timeZone, link: billingLink(deps) }));
  }
  if (reason && !before.read_only_reason) mails.push((to, shopName) => readOnlyMail(to, { shopName, reason: READ_ONLY_REASON_TEXT[reason], link: billingLink(deps) }));
  if (!reason && before.read_only_reason) mails.push((to, shopName) => restoredMail(to, { shopName, link: billingLink(deps) }));
  // Mails leave after the transaction commits, so a rolled-back change never mails anyone.
  return async () => {
    if (mails.length === 0) return;
    const shop = await findShopById(deps.db, before.shop_id);
    for (const to of await ownerEmails(deps.db, before.shop_id)) {
      for (const mail of mails) await deps.mailer.send(mail(to, shop?.name ?? 'Your shop', parseShopSettings(shop?.settings ?? '{}').timeZone));
    }
  };
}

/** Re-checks trial ends and grace periods by the clock, for every shop; hourly and on the billing pages. */
export async function applyBillingDeadlines(deps: AppDeps, shopId?: string): Promise<void> {
  const now = deps.clock.now();
  if (!shopId) for (const shop of await listShopsWithoutSubscription(deps.db)) await ensureSubscription(deps.db, shop.id, now);
  const rows = shopId ? [await ensureSubscription(deps.db, shopId, now)] : await listShopSubscriptions(deps.db);
  for (const row of rows) {
    const clock = [now.toISOString(), row.provider_clock].filter((t): t is string => Boolean(t)).sort().at(-1)!;
    const reason = readOnlyReasonOf({ status: row.status, trialEndsAt: row.stripe_subscription_id ? null : row.trial_ends_at, pastDueSince: row.past_due_since }, new Date(clock));
    if (reason === row.read_only_reason) continue;
    const send = await deps.db.transaction().execute((trx) => applyStanding(deps, trx, row, row, now));
    await send();
  }
}

const priceCache = new WeakMap<Stripe, Map<PlanId, string>>();
const lookupKey = (planId: PlanId) => `revloop_${planId}_seat_monthly_v1`;

/** The provider's recurring price for one seat of a plan, created on first use and found by lookup key after. */
export async function planPriceId(stripe: Stripe, planId: PlanId): Promise<string> {
  const cache = priceCache.get(stripe) ?? new Map<PlanId, string>();
  priceCache.set(stripe, cache);
  const cached = cache.get(planId);
  if (cached) return cached;
  const plan = planById(planId);
  const found = await stripe.prices.list({ lookup_keys: [lookupKey(planId)], active: true, limit: 1 });
  const price =
    found.data[0] ??
    (await stripe.prices.create(
      {
        currency: PLATFORM_CURRENCY.toLowerCase(),
        unit_amount: plan.seatPriceMinor,
        recurring: { interval: 'month' },
        lookup_key: lookupKey(planId),
        metadata: { planId },
        product_data: { name: `Revloop ${plan.name} — tuner seat` },
      },
      { idempotencyKey: `price-${lookupKey(planId)}` },
    ));
  cache.set(planId, price.id);
  return price.id;
}

/** The shop's customer at the provider, created once and remembered. */
export async function providerCustomerId(deps: AppDeps, shopId: string, email: string): Promise<string> {
  const row = await ensureSubscription(deps.db, shopId, deps.clock.now());
  if (row.stripe_customer_id) return row.stripe_customer_id;
  const shop = await findShopById(deps.db, shopId);
  const customer = await stripeFor(deps.env).customers.create(
    { email, name: shop?.name ?? undefined, metadata: { shopId } },
    { idempotencyKey: `customer-shop-${shopId}` },
  );
  await updateShopSubscription(deps.db, shopId, { stripe_customer_id: customer.id, updated_at: deps.clock.now().toISOString() });
  return customer.id;
}

const planOfItem = (item: Stripe.SubscriptionItem | undefined, fallback: PlanId): PlanId => {
  const id = item?.price.metadata?.planId;
  return PLANS.some((p) => p.id === id) ? (id as PlanId) : fallback;
};

/**
 * Brings the shop's row in line with the provider's current view of its subscription and invoices. Webhook
 * payloads are only a nudge: the current objects are fetched, so events arriving in any order converge.
 */
export async function syncSubscription(deps: AppDeps, shopRow: ShopSubscriptionRow, event: { id: string; created: number } | null, claim: (db: Db) => Promise<boolean>): Promise<void> {
  const stripe = stripeFor(deps.env);
  const customerId = shopRow.stripe_customer_id;
  if (!customerId) return;
  const subscriptions = await stripe.subscriptions.list({ customer: customerId, status: 'all', limit: 20 });
  const chosen = subscriptions.data.filter((s) => LIVE.has(s.status)).sort((a, b) => b.created - a.created)[0] ?? subscriptions.data.sort((a, b) => b.created - a.created)[0];
  const invoices = await stripe.invoices.list({ customer: customerId, limit: 24 });
  const latestInvoice = chosen ? invoices.data.find((i) => i.id === idOf(chosen.latest_invoice)) : undefined;
  const now = deps.clock.now();

  const send = await deps.db.transaction().execute(async (trx) => {
    if (!(await claim(trx))) return null;
    const before = (await findShopSubscription(trx, shopRow.shop_id))!;
    for (const invoice of invoices.data) {
      if (!invoice.id) continue;
      await upsertSubscriptionInvoice(trx, {
        id: invoice.id,
        shop_id: before.shop_id,
        status: invoice.status ?? 'draft',
        billing_reason: invoice.billing_reason ?? null,
        amount_due_minor: invoice.amount_due,
        amount_paid_minor: invoice.amount_paid,
        currency: invoice.currency.toUpperCase(),
        period_start: fromUnix(invoice.period_start),
        period_end: fromUnix(invoice.period_end),
        created_at: fromUnix(invoice.created)!,
        updated_at: now.toISOString(),
      });
    }
    // A shop still on its own trial, with nothing live at the provider, keeps its trial.
    if (!chosen || (!LIVE.has(chosen.status) && !before.stripe_subscription_id)) return null;
    const item = chosen.items.data[0];
    const status = toSubscriptionStatus(chosen.status);
    const pastDueSince = status === 'past_due' ? (before.status === 'past_due' && before.past_due_since ? before.past_due_since : (fromUnix(latestInvoice?.created) ?? now.toISOString())) : null;
    const providerClock = event ? fromUnix(event.created) : null;
    return applyStanding(deps, trx, before, {
      plan_id: planOfItem(item, before.plan_id),
      seats: item?.quantity ?? before.seats,
      status,
      trial_ends_at: fromUnix(chosen.trial_end),
      current_period_end: fromUnix(item?.current_period_end),
      cancel_at_period_end: chosen.cancel_at_period_end ? 1 : 0,
      past_due_since: pastDueSince,
      stripe_subscription_id: chosen.id,
      provider_clock: [providerClock, before.provider_clock].filter((t): t is string => Boolean(t)).sort().at(-1) ?? null,
    }, now);
  });
  await send?.();
}

/** Pays the open invoices of a past-due subscription with the card just saved (owner's "update payment"). */
export async function retryOpenInvoices(deps: AppDeps, customerId: string): Promise<void> {
  const stripe = stripeFor(deps.env);
  const open = await stripe.invoices.list({ customer: customerId, status: 'open', limit: 10 });
  for (const invoice of open.data) {
    if (!invoice.id) continue;
    await stripe.invoices.pay(invoice.id).catch((err: unknown) => {
      deps.logger.warn({ err, invoice: invoice.id }, 'retrying an open invoice with the new card failed');
    });
  }
}

/** A plan change on a live subscription: new price and seat count from the next invoice on. */
export async function changePlan(deps: AppDeps, shopId: string, planId: PlanId, seats: number): Promise<void> {
  const row = await ensureSubscription(deps.db, shopId, deps.clock.now());
  assertPlanChoice(planById(planId), seats, await countSeatsInUse(deps.db, shopId));
  if (!row.stripe_subscription_id || !LIVE.has(row.status)) {
    throw new DomainError('conflict', 'There is no running subscription to change: choose a plan through Checkout.');
  }
  const stripe = stripeFor(deps.env);
  const current = await stripe.subscriptions.retrieve(row.stripe_subscription_id);
  const item = current.items.data[0];
  if (!item) throw new DomainError('conflict', 'The subscription has no plan to change.');
  await stripe.subscriptions.update(
    current.id,
    { items: [{ id: item.id, price: await planPriceId(stripe, planId), quantity: seats }], proration_behavior: 'none', metadata: { shopId } },
    { idempotencyKey: `plan-${current.id}-${planId}-${seats}-${item.price.id}-${item.quantity ?? 0}` },
  );
  await syncSubscription(deps, row, null, async () => true);
}

/** `GET /api/billing/subscription`: plan, seats, usage, status, invoices and the plans on offer. */
export async function subscriptionView(deps: AppDeps, shopId: string): Promise<Subscription> {
  await applyBillingDeadlines(deps, shopId);
  const row = (await findShopSubscription(deps.db, shopId))!;
  const now = deps.clock.now();
  const plan = planById(row.plan_id);
  const monthStart = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), 1)).toISOString();
  const invoices = await listSubscriptionInvoices(deps.db, shopId);
  return {
    planId: plan.id,
    planName: plan.name,
    seats: row.seats,
    status: row.status,
    statusLabel: SUBSCRIPTION_STATUS_LABELS[row.status],
    currency: PLATFORM_CURRENCY,
    monthlyAmountMinor: monthlyAmountMinor(plan, row.seats),
    trialEndsAt: row.status === 'trialing' ? row.trial_ends_at : null,
    currentPeriodEnd: row.current_period_end,
    cancelAtPeriodEnd: row.cancel_at_period_end === 1,
    pastDueSince: row.past_due_since,
    graceEndsAt: row.past_due_since ? graceEndsAt(row.past_due_since).toISOString() : null,
    readOnlyReason: row.read_only_reason,
    readOnlyText: row.read_only_reason ? READ_ONLY_REASON_TEXT[row.read_only_reason] : null,
    managedByProvider: Boolean(row.stripe_subscription_id && LIVE.has(row.status)),
    hasPaymentMethod: Boolean(row.stripe_customer_id),
    usage: {
      seatsInUse: await countSeatsInUse(deps.db, shopId),
      jobsThisMonth: await countJobsOpenedSince(deps.db, shopId, monthStart),
      jobsPerMonth: plan.jobsPerMonth,
    },
    invoices: invoices.map((i) => ({
      id: i.id,
      status: i.status,
      reason: i.billing_reason,
      amountDueMinor: i.amount_due_minor,
      amountPaidMinor: i.amount_paid_minor,
      currency: i.currency,
      periodStart: i.period_start,
      periodEnd: i.period_end,
      createdAt: i.created_at,
    })),
    plans: PLANS.map((p) => ({ id: p.id, name: p.name, seatPriceMinor: p.seatPriceMinor, minSeats: p.minSeats, maxSeats: p.maxSeats, jobsPerMonth: p.jobsPerMonth, summary: p.summary })),
  };
}

/**
 * Checkout for the shop's own payment to the platform: save a card (setup mode) or subscribe to a plan. A shop still
 * in its trial keeps the days it has left; the first charge comes when they run out.
 */
export async function startSubscriptionCheckout(deps: AppDeps, shopId: string, email: string, input: Extract<CheckoutInput, { purpose: 'subscription' | 'payment_method' }>): Promise<string | null> {
  const billingUrl = `${deps.env.APP_ORIGIN}/billing`;
  const stripe = stripeFor(deps.env);
  const customer = await providerCustomerId(deps, shopId, email);
  if (input.purpose === 'payment_method') {
    const session = await stripe.checkout.sessions.create({ mode: 'setup', customer, currency: PLATFORM_CURRENCY.toLowerCase(), success_url: `${billingUrl}?card=saved`, cancel_url: billingUrl, metadata: { shopId } });
    return session.url;
  }
  const row = await ensureSubscription(deps.db, shopId, deps.clock.now());
  if (row.stripe_subscription_id && ['trialing', 'active', 'past_due', 'unpaid'].includes(row.status)) {
    throw new DomainError('conflict', 'The shop already has a running subscription: change its plan instead.');
  }
  const plan = planById(input.planId);
  assertPlanChoice(plan, input.seats, await countSeatsInUse(deps.db, shopId));
  const trialDaysLeft = row.status === 'trialing' && row.trial_ends_at ? Math.floor((Date.parse(row.trial_ends_at) - deps.clock.now().getTime()) / DAY_MS) : 0;
  const session = await stripe.checkout.sessions.create({
    mode: 'subscription',
    customer,
    line_items: [{ price: await planPriceId(stripe, plan.id), quantity: input.seats }],
    subscription_data: { metadata: { shopId, planId: plan.id }, ...(trialDaysLeft >= 1 && { trial_period_days: trialDaysLeft }) },
    metadata: { shopId },
    success_url: `${billingUrl}?checkout=done`,
    cancel_url: billingUrl,
  });
  return session.url;
}
